import { formatIsoDate } from "@/lib/format";
import { changesNotInText } from "@/lib/plan-of-record-text";

/**
 * Says when the field log has moved past the latest re-forecast (shifts worked after its data date, recorded or
 * corrected since it was run, or deleted since — db/queries/progress.ts `shiftsNotInRun`), so the forecast the owner is told is
 * known to be behind the field. Nothing when it is up to date.
 */
export function BehindFieldNotice(props: { shiftsNotIn: number | null; dataDate: string | null; shiftsRecorded: number; whoCanRun: "you" | "others" | "nobody" }) {
  const { shiftsNotIn, dataDate, shiftsRecorded, whoCanRun } = props;
  // An archived project is a record: nobody is asked to re-forecast it.
  const ask = { you: " Re-forecast above to bring it up to date.", others: " An engineer or scheduler can re-forecast to bring it up to date.", nobody: "" }[whoCanRun];
  if (dataDate === null) {
    if (shiftsRecorded === 0) return null;
    return (
      <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" role="status" data-testid="behind-field">
        No re-forecast yet: the {shiftsRecorded.toLocaleString("en-US")} shift{shiftsRecorded === 1 ? "" : "s"} recorded are in no forecast.{ask}
      </p>
    );
  }
  if (!shiftsNotIn) return null;
  return (
    <p className="rounded-md border border-warn/30 bg-warn-bg px-4 py-2 text-sm" role="status" data-testid="behind-field">
      The field has moved past the latest re-forecast (from {formatIsoDate(dataDate)}): {changesNotInText(shiftsNotIn, "it")} — shifts worked after its data date, recorded or
      corrected since it was run, or deleted since.{ask}
    </p>
  );
}
