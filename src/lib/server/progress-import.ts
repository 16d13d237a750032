import "server-only";
/**
 * A field-log file as the import and its check read it (src/lib/csv/field-log-import.ts): the upload read, every row
 * checked against the plan, the shifts already in the log and the file's other rows; a 400 naming each line and
 * column when any row fails, or when no row is left to load. One reading for both, so a file that passes the check
 * is the file the import loads.
 */
import { AppError } from "./errors";
import { readCsvUpload, rowErrors } from "./csv-upload";
import { toRule } from "./progress";
import { validateDefinition } from "./scenario-input";
import { readFieldLogCsv } from "@/lib/csv/field-log-import";
import { todayIn } from "@/lib/progress-schema";
import { listProgress } from "@db/queries/progress";

export async function readShiftsFile(req: Request, scenario: { id: string; definition: unknown }) {
  const { text } = await readCsvUpload(req);
  const plan = validateDefinition(scenario.definition);
  const existing = (await listProgress({ scenarioId: scenario.id })).map(toRule);
  const read = readFieldLogCsv(text, plan, existing, todayIn(plan.timeZone));
  if (read.problems.length) throw rowErrors(read.problems);
  if (read.shifts.length === 0) throw new AppError("bad_request", "The file has no shifts to load (every row is marked deleted).", [{ path: "file", message: "has no recorded shifts" }]);
  return { plan, read };
}
