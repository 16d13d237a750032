/**
 * Length limits of the scenario format. Common practice, no published source: each is several times what a
 * real bridge deck needs (the demo has 3 lanes, 7 operations, 6 links, 2 closures) and small enough that
 * parsing, validating and storing a scenario stays instant. README's field table states them.
 */
export const LIMITS = {
  /** Scenario, shift, closure, operation and direction names (characters). */
  name: 120,
  description: 2_000,
  /** A deck's length in feet (about 9.5 miles; a project's deck too, since its scenarios start from it). */
  deckLengthFt: 50_000,
  /** Lane names ("L1", "Eastbound right"). */
  laneName: 40,
  /** An IANA zone name; the longest real one has 30 characters. */
  timeZone: 64,
  lanes: 12,
  surveyRanges: 500,
  operations: 40,
  links: 200,
  /** Shifts and closure windows, each. */
  calendarItems: 50,
  /**
   * Short-term closures (and the traffic entries that refer to them). With one standing closure per stage
   * they make the closure timeline's set of standing closures one 32-bit mask: 18 + 12 stages ≤ 30 bits.
   */
  closures: 18,
  /** Stages of the work (see `closures`). */
  stages: 12,
  /** Blackout dates and fixed wet dates, each. */
  dates: 500,
} as const;
