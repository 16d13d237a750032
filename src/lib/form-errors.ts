/**
 * Server answers in the small forms: a 400's field problems land on the form's own fields (by react-hook-form
 * name, `emailTo[2]` → `emailTo`), so people read them beside the field they typed, in the field's words;
 * whatever names no field of the form comes back for a general message.
 */
import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { ApiError, type FieldProblem } from "./api-client";

/** `emailTo[2]` → `emailTo`, `definition.name` → `definition.name`: the form field a problem belongs to. */
export function fieldOfProblem(path: string): string {
  return path.replace(/\[\d+\].*$/, "").replace(/\.\d+(\..*)?$/, "");
}

/**
 * Puts each field problem of `error` on its field (through `fieldFor`, which may rename or drop a path) and
 * returns the text to show above the form, or null when every problem found its field.
 */
export function applyServerErrors<T extends FieldValues>(
  error: unknown,
  setError: UseFormSetError<T>,
  fieldFor: (path: string) => Path<T> | null,
): string | null {
  if (!(error instanceof ApiError)) return error instanceof Error ? error.message : error ? String(error) : null;
  const left: FieldProblem[] = [];
  for (const p of error.fields) {
    const field = fieldFor(fieldOfProblem(p.path));
    if (field) setError(field, { type: "server", message: p.message });
    else left.push(p);
  }
  if (error.fields.length === 0) return error.message;
  return left.length ? `${error.message} ${left.map((p) => p.message).join("; ")}` : null;
}
