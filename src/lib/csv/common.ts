/** Reading an uploaded CSV into typed rows, with every row-level problem named by its line in the file. */
import Papa from "papaparse";

export const MAX_UPLOAD_BYTES = 5 * 1024 * 1024;

export interface RowProblem {
  /** Line number in the file (the header is line 1). */
  row: number;
  field: string;
  message: string;
}

export interface CsvTable {
  headers: string[];
  rows: { line: number; values: Record<string, string> }[];
  problems: RowProblem[];
}

const normalizeHeader = (h: string) => h.trim().toLowerCase().replace(/[\s-]+/g, "_");

/** A file that is not text (a spreadsheet, an image, a PDF) has NUL bytes or a known binary signature early on. */
export function looksLikeText(bytes: Uint8Array): boolean {
  const head = bytes.subarray(0, Math.min(bytes.length, 4096));
  if (head.length >= 4 && head[0] === 0x50 && head[1] === 0x4b && head[2] === 0x03 && head[3] === 0x04) return false; // zip / xlsx
  if (head.length >= 4 && head[0] === 0x25 && head[1] === 0x50 && head[2] === 0x44 && head[3] === 0x46) return false; // %PDF
  for (const b of head) if (b === 0) return false;
  return true;
}

export function readCsv(text: string, required: string[], optional: string[] = []): CsvTable {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: "greedy" });
  const problems: RowProblem[] = parsed.errors.map((e) => ({ row: (e.row ?? 0) + 1, field: "(row)", message: e.message }));
  const [headerRow, ...data] = parsed.data;
  if (!headerRow) return { headers: [], rows: [], problems: [{ row: 1, field: "(file)", message: "the file is empty" }] };
  const headers = headerRow.map(normalizeHeader);
  for (const r of required) if (!headers.includes(r)) problems.push({ row: 1, field: r, message: `the header has no "${r}" column (found: ${headers.join(", ") || "nothing"})` });
  const known = new Set([...required, ...optional]);
  const rows = data.map((cells, i) => {
    const values: Record<string, string> = {};
    headers.forEach((h, j) => {
      if (known.has(h)) values[h] = (cells[j] ?? "").trim();
    });
    return { line: i + 2, values };
  });
  if (rows.length === 0 && problems.length === 0) problems.push({ row: 2, field: "(file)", message: "the file has a header but no data rows" });
  return { headers, rows, problems };
}

/** The header as written and every data row's cells by position (for files whose columns are found by name). */
export function readCsvRows(text: string): { headers: string[]; rows: { line: number; cells: string[] }[]; problems: RowProblem[] } {
  const parsed = Papa.parse<string[]>(text.replace(/^\uFEFF/, ""), { skipEmptyLines: "greedy" });
  const problems: RowProblem[] = parsed.errors.map((e) => ({ row: (e.row ?? 0) + 1, field: "(row)", message: e.message }));
  const [headerRow, ...data] = parsed.data;
  if (!headerRow) return { headers: [], rows: [], problems: [{ row: 1, field: "(file)", message: "the file is empty" }] };
  const rows = data.map((cells, i) => ({ line: i + 2, cells }));
  if (rows.length === 0 && problems.length === 0) problems.push({ row: 2, field: "(file)", message: "the file has a header but no data rows" });
  return { headers: headerRow, rows, problems };
}

export function numberCell(raw: string | undefined, line: number, field: string, problems: RowProblem[], opts: { min?: number; max?: number; optional?: boolean } = {}): number | undefined {
  if (raw === undefined || raw === "") {
    if (!opts.optional) problems.push({ row: line, field, message: "is empty" });
    return undefined;
  }
  const v = Number(raw);
  if (!Number.isFinite(v)) {
    problems.push({ row: line, field, message: `"${raw}" is not a number` });
    return undefined;
  }
  if (opts.min !== undefined && v < opts.min) problems.push({ row: line, field, message: `${v} is below ${opts.min}` });
  if (opts.max !== undefined && v > opts.max) problems.push({ row: line, field, message: `${v} is above ${opts.max}` });
  return v;
}
