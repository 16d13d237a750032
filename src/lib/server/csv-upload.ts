import "server-only";
/**
 * One CSV file sent as a form upload (multipart/form-data), read the one way every upload route reads it: the body
 * under a byte limit (Content-Length and counted, so a huge upload is refused early), the form parsed, the file
 * present, within the limit, with a sane name, and text rather than a spreadsheet or a PDF. And the one way its
 * row problems are answered: a 400 naming each line of the file and its column, nothing stored.
 */
import { AppError } from "./errors";
import { readBodyBytes } from "./json-body";
import { looksLikeText, MAX_UPLOAD_BYTES, type RowProblem } from "@/lib/csv/common";
import { controlCharacterIn } from "@sim/text";

/** The file plus the form's other fields and multipart framing. */
const MAX_UPLOAD_BODY_BYTES = MAX_UPLOAD_BYTES + 64 * 1024;
const CSV_TYPES = new Set(["text/csv", "text/plain", "application/csv", "application/vnd.ms-excel", ""]);
const MB = MAX_UPLOAD_BYTES / 1024 / 1024;

/** The form (its other fields for the route to check), the file and its text. */
export async function readCsvUpload(req: Request): Promise<{ form: FormData; file: File; content: Uint8Array; text: string }> {
  const bytes = await readBodyBytes(req, MAX_UPLOAD_BODY_BYTES);
  if (bytes === "too_large") throw new AppError("too_large", `The upload is too large: the limit is ${MB} MB for a file. Nothing was imported.`, [{ path: "file", message: `must be at most ${MB} MB` }]);
  let form: FormData;
  try {
    form = await new Response(bytes as BodyInit, { headers: { "content-type": req.headers.get("content-type") ?? "" } }).formData();
  } catch {
    throw new AppError("bad_request", "Send the file as a form upload (multipart/form-data).", [{ path: "file", message: "is missing" }]);
  }
  const file = form.get("file");
  if (!(file instanceof File) || file.size === 0) throw new AppError("bad_request", "Choose a CSV file to upload.", [{ path: "file", message: "is missing or empty" }]);
  if (file.size > MAX_UPLOAD_BYTES) throw new AppError("too_large", `The file is ${(file.size / 1024 / 1024).toFixed(1)} MB; the limit is ${MB} MB.`, [{ path: "file", message: `is larger than ${MB} MB` }]);
  if (file.name.length > 200 || controlCharacterIn(file.name)) {
    throw new AppError("bad_request", "The file name is too long or contains control characters; rename the file and upload it again.", [{ path: "file", message: "has a file name longer than 200 characters or with control characters" }]);
  }
  const content = new Uint8Array(await file.arrayBuffer());
  if (!/\.(csv|txt)$/i.test(file.name) || !CSV_TYPES.has(file.type) || !looksLikeText(content)) {
    throw new AppError("unsupported", `“${file.name}” is not a CSV file. Export the sheet as CSV (comma-separated values) and upload that.`, [{ path: "file", message: "is not a CSV file" }]);
  }
  return { form, file, content, text: new TextDecoder("utf-8", { fatal: false }).decode(content) };
}

/** A 400 listing the file's problems by line and column (at most the error list's cap), saying nothing was imported. */
export function rowErrors(problems: RowProblem[], read?: { columns: { header: string; readAs: string; unit: string | null }[]; ignored: string[] }) {
  // A unit question (row 1, "… unit") is about the whole file, not a row.
  const where = (p: RowProblem) => (p.field.endsWith(" unit") ? p.field : `row ${p.row}${p.field.startsWith("(") ? "" : ` · ${p.field}`}`);
  const howRead = read?.columns.length ? ` Read as: ${read.columns.map((c) => `“${c.header}” = ${c.readAs}${c.unit ? ` in ${c.unit}` : ""}`).join("; ")}.` : "";
  return new AppError(
    "bad_request",
    `The file has ${problems.length} problem${problems.length === 1 ? "" : "s"}; nothing was imported. Fix ${problems.length === 1 ? "it" : "them"} and upload again.${howRead}`,
    problems.map((p) => ({ path: where(p), message: p.message })),
  );
}
