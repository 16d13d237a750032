/**
 * A starting plan for a new scenario on a project: the usual seven-operation overlay chain over the project's
 * deck, with day single-lane and night two-lane closures. Rates and limits are placeholders a planner must
 * replace with the job's own (the values are common practice, no published source; the 45 °F-and-rising
 * placement rule and the 0.1 lb/ft²/h LMC evaporation limit are cited in SOURCES.md).
 */
import type { ScenarioInput } from "@sim/schema";

export interface ProjectDeck {
  deckLengthFt: number;
  startStationFt: number;
  lanes: string[];
}

// A mid-latitude climate profile, invented for the template: replace it with the site's own (or fit it
// from a weather history upload).
const TEMPLATE_CLIMATE = [
  [38, 9, 22, 9, 0.22, 0.45, 11, 72],
  [43, 9, 25, 9, 0.22, 0.45, 11, 70],
  [54, 9, 34, 8, 0.24, 0.48, 12, 67],
  [66, 8, 44, 7, 0.26, 0.5, 12, 64],
  [75, 7, 54, 7, 0.27, 0.5, 10, 66],
  [84, 6, 63, 6, 0.25, 0.45, 9, 67],
  [88, 5, 68, 5, 0.23, 0.42, 8, 68],
  [86, 5, 66, 5, 0.22, 0.42, 8, 70],
  [79, 6, 58, 6, 0.2, 0.4, 8, 70],
  [67, 8, 46, 7, 0.18, 0.4, 9, 68],
  [53, 9, 35, 8, 0.22, 0.43, 10, 71],
  [42, 9, 26, 9, 0.23, 0.45, 11, 73],
].map(([tmaxMeanF, tmaxSdF, tminMeanF, tminSdF, pWetAfterDry, pWetAfterWet, windMeanMph, rhMean]) => ({
  tmaxMeanF,
  tmaxSdF,
  tminMeanF,
  tminSdF,
  pWetAfterDry,
  pWetAfterWet,
  windMeanMph,
  rhMean,
}));

export function templateScenario(name: string, deck: ProjectDeck, startDate: string): ScenarioInput {
  const lanes = deck.lanes.length ? deck.lanes : ["L1"];
  const oneLane = [lanes[lanes.length - 1]];
  const twoLanes = lanes.length > 1 ? lanes.slice(-2) : oneLane;
  const crew = (id: string, opName: string, ftPerShift: [number, number, number], closure: string, extra: Record<string, unknown> = {}) => ({
    id,
    name: opName,
    kind: "crew" as const,
    rate: { unit: "ftPerShift" as const, dist: { type: "triangular" as const, min: ftPerShift[0], mode: ftPerShift[1], max: ftPerShift[2] } },
    crews: 1,
    shifts: ["night"],
    closure,
    mobilizationHours: 4,
    ...extra,
  });
  return {
    schemaVersion: 2,
    name,
    description: "",
    startDate,
    timeZone: "America/Chicago",
    deck: { startStationFt: deck.startStationFt, lengthFt: deck.deckLengthFt, packetFt: 100, lanes, survey: [] },
    discovered: { defaultProbability: 0.08, extraHours: { type: "triangular", min: 2, mode: 5, max: 12 } },
    calendar: {
      shifts: [
        { id: "day", name: "Day shift", startHour: 7, lengthHours: 10 },
        { id: "night", name: "Night shift", startHour: 20, lengthHours: 9 },
      ],
      workDays: [0, 1, 2, 3, 4],
      closures: [
        { id: "one-lane", name: "Single-lane closure", lanesClosed: oneLane },
        { id: "two-lane", name: "Two-lane closure", lanesClosed: twoLanes },
      ],
      closureWindows: [
        { closure: "one-lane", dayTypes: ["weekday"], startHour: 9, endHour: 15 },
        { closure: "one-lane", dayTypes: ["weekday", "sunday"], startHour: 19, endHour: 6 },
        { closure: "two-lane", dayTypes: ["weekday", "sunday"], startHour: 21, endHour: 5 },
      ],
      holidays: { policy: "standDown", observeFederal: true, blackoutDates: [] },
      season: { plan: "single", winterStart: "11-20", winterEnd: "03-20", demobilizeHours: 16, remobilizeHours: 16 },
    },
    operations: [
      crew("setup", "Work-zone setup", [900, 1200, 1500], "one-lane", { mobilizationHours: 2 }),
      crew("milling", "Mechanical milling", [500, 700, 900], "two-lane"),
      crew("hydrodemo", "Hydrodemolition", [250, 350, 450], "two-lane", { discovers: true }),
      crew("cleanup", "Cleanup", [600, 800, 1000], "two-lane", { mobilizationHours: 1 }),
      // By day: pours start only while the air is warming (45 °F and rising).
      crew("placement", "LMC overlay placement", [300, 400, 500], "one-lane", {
        shifts: ["day"],
        continuous: true,
        gates: { minTempF: 45, rising: true, noRain: true, noRainHoursAfter: 3, maxEvaporation: 0.1, concreteDeltaF: 5 },
      }),
      { id: "cure", name: "Wet cure and dry cure", kind: "wait" as const, durationHours: { type: "fixed" as const, value: 96 } },
      crew("restriping", "Restriping", [1500, 2000, 2500], "one-lane", { mobilizationHours: 1, gates: { minTempF: 40, noRain: true } }),
    ],
    links: [
      { from: "setup", to: "milling", lagFt: 0, lagHours: 0 },
      { from: "milling", to: "hydrodemo", lagFt: 100, lagHours: 0 },
      { from: "hydrodemo", to: "cleanup", lagFt: 0, lagHours: 0 },
      { from: "cleanup", to: "placement", lagFt: 0, lagHours: 12 },
      { from: "placement", to: "cure", lagFt: 0, lagHours: 0 },
      { from: "cure", to: "restriping", lagFt: 0, lagHours: 0 },
    ],
    // One stage over every lane with no standing closure: lanes close only under the operations' closures.
    stages: [{ id: "whole-deck", name: "Whole deck", lanes, standingLanesClosed: [] }],
    weather: { mode: "stochastic", monthly: TEMPLATE_CLIMATE },
  };
}
