import { formatIsoDay, formatStation } from "@/lib/format";

/** What the inspector just recorded (the form's values: stations may still be the text typed), in the log's own words — "Recorded Work-zone setup, Day shift of Thu 3 Dec 2026, STA 12+00 to STA 13+00." */
export function recordedText(v: { workDate: string; shift: string; operationId: string; fromStationFt: number | string; toStationFt: number | string }, facts: { shifts: { id: string; name: string }[]; operations: { id: string; name: string }[] }): string {
  const shift = facts.shifts.find((s) => s.id === v.shift)?.name ?? v.shift;
  const op = facts.operations.find((o) => o.id === v.operationId)?.name ?? v.operationId;
  return `Recorded ${op}, ${shift} of ${formatIsoDay(v.workDate)}, ${formatStation(Number(v.fromStationFt))} to ${formatStation(Number(v.toStationFt))}.`;
}
