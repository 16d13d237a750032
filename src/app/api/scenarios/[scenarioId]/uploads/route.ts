import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { insertUpload, listUploads } from "@db/queries/uploads";
import { looksLikeText, MAX_UPLOAD_BYTES, type RowProblem } from "@/lib/csv/common";
import { parseWeatherCsv } from "@/lib/csv/weather-csv";
import { parseSurveyCsv } from "@/lib/csv/survey-csv";
import { fitClimateProfile } from "@sim/weather-fit";
import { controlCharacterIn } from "@sim/text";
import { LIMITS } from "@sim/limits";
import { readBodyBytes } from "@/lib/server/json-body";
import type { UploadAnswer, UploadPreview, UploadsAnswer } from "@/lib/upload-contract";

/** The file plus the form's other fields and multipart framing. */
const MAX_UPLOAD_BODY_BYTES = MAX_UPLOAD_BYTES + 64 * 1024;

type Ctx = { params: Promise<{ scenarioId: string }> };

const uploadFields = z.discriminatedUnion("kind", [
  z.object({
    kind: z.literal("weather"),
    // "auto": the unit the column's header states, else guessed from the values (the answer says which).
    temperature: z.enum(["auto", "F", "C"], { error: "Temperature unit must be °F, °C or read from the file" }).default("auto"),
    precipitation: z.enum(["auto", "in", "mm"], { error: "Precipitation unit must be inches, millimetres or read from the file" }).default("auto"),
    wind: z.enum(["auto", "mph", "kmh", "ms"], { error: "Wind unit must be mph, km/h, m/s or read from the file" }).default("auto"),
  }),
  z.object({ kind: z.literal("survey") }),
]);

const CSV_TYPES = new Set(["text/csv", "text/plain", "application/csv", "application/vnd.ms-excel", ""]);

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  const uploads = (await listUploads({ scenarioId })).map((u) => ({ ...u, uploadedAt: u.uploadedAt.toISOString() }));
  return NextResponse.json({ uploads } satisfies UploadsAnswer);
});

function rowErrors(problems: RowProblem[], read?: { columns: { header: string; readAs: string; unit: string | null }[]; ignored: string[] }) {
  // A unit question (row 1, "… unit") is about the whole file, not a row.
  const where = (p: RowProblem) => (p.field.endsWith(" unit") ? p.field : `row ${p.row}${p.field.startsWith("(") ? "" : ` · ${p.field}`}`);
  const howRead = read?.columns.length ? ` Read as: ${read.columns.map((c) => `“${c.header}” = ${c.readAs}${c.unit ? ` in ${c.unit}` : ""}`).join("; ")}.` : "";
  return new AppError(
    "bad_request",
    `The file has ${problems.length} problem${problems.length === 1 ? "" : "s"}; nothing was imported. Fix them and upload again.${howRead}`,
    problems.map((p) => ({ path: where(p), message: p.message })),
  );
}

/** Checks and stores a CSV, and returns what it would change; applying it is a normal, versioned save of the plan. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "editScenario");
  // The body is read under a byte limit first (Content-Length and counted), so a huge upload is refused early.
  const bytes = await readBodyBytes(req, MAX_UPLOAD_BODY_BYTES);
  if (bytes === "too_large") {
    throw new AppError("too_large", `The upload is too large: the limit is ${MAX_UPLOAD_BYTES / 1024 / 1024} MB for a file. Nothing was imported.`, [{ path: "file", message: `must be at most ${MAX_UPLOAD_BYTES / 1024 / 1024} MB` }]);
  }
  let form: FormData;
  try {
    form = await new Response(bytes as BodyInit, { headers: { "content-type": req.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new AppError("bad_request", "Send the file as a form upload (multipart/form-data).", [{ path: "file", message: "is missing" }]);
  }
  const fields = uploadFields.safeParse(Object.fromEntries([...form.entries()].filter(([, v]) => typeof v === "string")));
  if (!fields.success) throw new AppError("bad_request", "Some fields need attention.", fields.error.issues.map((i) => ({ path: i.path.join(".") || "kind", message: i.message })));
  const file = form.get("file");
  if (!(file instanceof File) || file.size === 0) throw new AppError("bad_request", "Choose a CSV file to upload.", [{ path: "file", message: "is missing or empty" }]);
  if (file.size > MAX_UPLOAD_BYTES) {
    throw new AppError("too_large", `The file is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${MAX_UPLOAD_BYTES / 1024 / 1024} MB.`, [{ path: "file", message: "is larger than 5 MB" }]);
  }
  if (file.name.length > 200 || controlCharacterIn(file.name)) {
    throw new AppError("bad_request", "The file name is too long or contains control characters; rename the file and upload it again.", [{ path: "file", message: "has a file name longer than 200 characters or with control characters" }]);
  }
  const content = new Uint8Array(await file.arrayBuffer());
  const nameOk = /\.(csv|txt)$/i.test(file.name);
  if (!nameOk || !CSV_TYPES.has(file.type) || !looksLikeText(content)) {
    throw new AppError("unsupported", `“${file.name}” is not a CSV file. Export the sheet as CSV (comma-separated values) and upload that.`, [{ path: "file", message: "is not a CSV file" }]);
  }
  const text = new TextDecoder("utf-8", { fatal: false }).decode(content);
  const definition = validateDefinition(scenario.definition);

  let preview: UploadPreview;
  let rowCount: number;
  if (fields.data.kind === "weather") {
    const { observations, problems, columns, ignored, skipped } = parseWeatherCsv(text, { temperature: fields.data.temperature, precipitation: fields.data.precipitation, wind: fields.data.wind });
    if (problems.length) throw rowErrors(problems, { columns, ignored });
    const fit = fitClimateProfile(observations);
    rowCount = observations.length;
    // A file without one complete day is refused above, so the first and last days exist.
    preview = { kind: "weather", fit, current: definition.weather, days: observations.length, from: observations[0].date, to: observations.at(-1)!.date, columns, ignored, skipped };
  } else {
    const { ranges, problems } = parseSurveyCsv(text, definition.deck);
    if (problems.length) throw rowErrors(problems);
    // Refused here rather than when the plan is saved: a scenario holds at most LIMITS.surveyRanges ranges.
    if (ranges.length > LIMITS.surveyRanges) {
      throw new AppError("bad_request", `The survey has ${ranges.length.toLocaleString("en-US")} ranges; a scenario holds at most ${LIMITS.surveyRanges}. Merge neighbouring ranges and upload again.`, [
        { path: "file", message: `at most ${LIMITS.surveyRanges} survey ranges (got ${ranges.length.toLocaleString("en-US")})` },
      ]);
    }
    rowCount = ranges.length;
    preview = { kind: "survey", ranges, current: definition.deck.survey };
  }
  const row = await insertUpload({
    projectId: scenario.projectId,
    scenarioId,
    kind: fields.data.kind,
    filename: file.name,
    contentType: file.type || "text/csv",
    content: Buffer.from(content),
    rowCount,
    userId: user.id,
  });
  const answer: UploadAnswer = { upload: { id: row.id, uploadedAt: row.uploadedAt.toISOString(), filename: file.name, rowCount }, preview, scenarioVersion: scenario.version };
  return NextResponse.json(answer, { status: 201 });
});
