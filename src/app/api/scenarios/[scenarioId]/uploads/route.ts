import { NextResponse } from "next/server";
import { z } from "zod";
import { AppError, handler } from "@/lib/server/errors";
import { requireScenario } from "@/lib/server/access";
import { validateDefinition } from "@/lib/server/scenario-input";
import { insertUpload, listUploads } from "@db/queries/uploads";
import { readCsvUpload, rowErrors } from "@/lib/server/csv-upload";
import { parseWeatherCsv } from "@/lib/csv/weather-csv";
import { parseSurveyCsv } from "@/lib/csv/survey-csv";
import { fitClimateProfile } from "@sim/weather-fit";
import { LIMITS } from "@sim/limits";
import type { UploadAnswer, UploadPreview, UploadsAnswer } from "@/lib/upload-contract";

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

export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  await requireScenario(scenarioId, "read");
  const uploads = (await listUploads({ scenarioId })).map((u) => ({ ...u, uploadedAt: u.uploadedAt.toISOString() }));
  return NextResponse.json({ uploads } satisfies UploadsAnswer);
});

/** Checks and stores a CSV, and returns what it would change; applying it is a normal, versioned save of the plan. */
export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { scenarioId } = await ctx.params;
  const { scenario, user } = await requireScenario(scenarioId, "editScenario");
  const { form, file, content, text } = await readCsvUpload(req);
  const fields = uploadFields.safeParse(Object.fromEntries([...form.entries()].filter(([, v]) => typeof v === "string")));
  if (!fields.success) throw new AppError("bad_request", "Some fields need attention.", fields.error.issues.map((i) => ({ path: i.path.join(".") || "kind", message: i.message })));
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
