/**
 * A deck survey: `from_station, to_station` and either `repair_share` (0–1, the share of the area expected to
 * need deeper repair, used directly as the per-packet probability) or `condition_rating` (0–9). Stations are
 * feet (`1250`) or station notation (`12+50`).
 */
import { numberCell, readCsv, type RowProblem } from "./common";

export interface SurveyRange {
  fromStationFt: number;
  toStationFt: number;
  probability: number;
}

/**
 * Deck condition rating → chance that a packet reveals deeper deterioration. Common practice, no published
 * source: a planner's rough reading of the 0–9 deck rating scale; replace it with the project's own survey.
 */
export const RATING_TO_PROBABILITY: Record<number, number> = { 9: 0.01, 8: 0.01, 7: 0.03, 6: 0.06, 5: 0.12, 4: 0.25, 3: 0.45, 2: 0.7, 1: 0.9, 0: 0.95 };

// One station reader for the survey, the field log and the editor: feet or 12+50.
export { parseStation } from "@sim/progress-rules";
import { parseStation } from "@sim/progress-rules";

export function parseSurveyCsv(text: string, deck: { startStationFt: number; lengthFt: number }): { ranges: SurveyRange[]; problems: RowProblem[] } {
  const table = readCsv(text, ["from_station", "to_station"], ["repair_share", "condition_rating"]);
  const problems = [...table.problems];
  if (!problems.some((p) => p.row === 1) && !table.headers.includes("repair_share") && !table.headers.includes("condition_rating")) {
    problems.push({ row: 1, field: "repair_share", message: 'the header needs a "repair_share" or a "condition_rating" column' });
  }
  if (problems.some((p) => p.row === 1)) return { ranges: [], problems };
  const deckEnd = deck.startStationFt + deck.lengthFt;
  const ranges: SurveyRange[] = [];
  for (const { line, values } of table.rows) {
    const before = problems.length;
    const from = parseStation(values.from_station ?? "");
    const to = parseStation(values.to_station ?? "");
    if (from === null) problems.push({ row: line, field: "from_station", message: `"${values.from_station}" is not a station (1250 or 12+50)` });
    if (to === null) problems.push({ row: line, field: "to_station", message: `"${values.to_station}" is not a station (1250 or 12+50)` });
    if (from !== null && (from < deck.startStationFt || from > deckEnd)) problems.push({ row: line, field: "from_station", message: `${from} ft is outside the deck (${deck.startStationFt}–${deckEnd} ft)` });
    if (to !== null && (to < deck.startStationFt || to > deckEnd)) problems.push({ row: line, field: "to_station", message: `${to} ft is outside the deck (${deck.startStationFt}–${deckEnd} ft)` });
    if (from !== null && to !== null && to <= from) problems.push({ row: line, field: "to_station", message: "must be greater than from_station" });
    let probability: number | undefined;
    if (values.repair_share) probability = numberCell(values.repair_share, line, "repair_share", problems, { min: 0, max: 1 });
    else if (values.condition_rating) {
      const r = numberCell(values.condition_rating, line, "condition_rating", problems, { min: 0, max: 9 });
      if (r !== undefined && !Number.isInteger(r)) problems.push({ row: line, field: "condition_rating", message: `${r} is not a whole rating 0–9` });
      else if (r !== undefined) probability = RATING_TO_PROBABILITY[r];
    } else problems.push({ row: line, field: "repair_share", message: "is empty (give repair_share or condition_rating)" });
    if (problems.length > before) continue;
    ranges.push({ fromStationFt: from!, toStationFt: to!, probability: probability! });
  }
  return { ranges, problems };
}
