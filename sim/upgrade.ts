/**
 * Scenario format versions (MODEL.md, "Scenario versions"). Contract: `upgradeScenario(input)` takes a scenario
 * as stored or written (any version, not yet validated) and returns the current (version 2) form as plain
 * JSON; input that is already version 2, or not a version-1 object, comes back unchanged (the schema then
 * says what is wrong). Version 1 → 2: one stage over every deck lane with no standing closure (the version-1
 * meaning: lanes were closed only by the operations' closures), every calendar closure a short-term closure
 * with no set-up or take-down time, and the holiday stand-down settings of version 1 (15:00 the day before,
 * not through the Monday). Pure: the input is never modified. The database migration
 * `upgrade-scenarios-v2` applies the same rule to stored rows.
 */

type Json = Record<string, unknown>;

const isObject = (x: unknown): x is Json => typeof x === "object" && x !== null && !Array.isArray(x);

/** The stage a version-1 scenario becomes: the whole deck, every lane, no standing closure. */
export function wholeDeckStage(lanes: unknown): Json {
  return { id: "whole-deck", name: "Whole deck", lanes: Array.isArray(lanes) ? [...lanes] : [], standingLanesClosed: [] };
}

export function upgradeScenario(input: unknown): unknown {
  if (!isObject(input) || input.schemaVersion !== 1) return input;
  const out: Json = structuredClone(input);
  out.schemaVersion = 2;
  const deck = isObject(out.deck) ? out.deck : {};
  if (!Array.isArray(out.stages)) out.stages = [wholeDeckStage(deck.lanes)];
  if (isObject(out.calendar)) {
    const cal = out.calendar;
    if (Array.isArray(cal.closures))
      cal.closures = cal.closures.map((c) => (isObject(c) ? { setupHours: 0, takedownHours: 0, ...c } : c));
    if (isObject(cal.holidays)) cal.holidays = { standDownStartHour: 15, standDownThroughMonday: false, ...cal.holidays };
  }
  return out;
}
