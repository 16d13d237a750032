"use client";
import { ApiError, type FieldProblem } from "@/lib/api-client";

/** Why an uploaded file was refused: the answer's sentence, then each problem by its line and column, scrolling when many. */
export function UploadProblems({ error }: { error: Error }) {
  const fields: FieldProblem[] = error instanceof ApiError ? error.fields : [];
  return (
    <div role="alert" className="mt-4 rounded-md border border-bad/40 bg-bad-bg px-3 py-2 text-sm" data-testid="upload-errors">
      <p className="font-medium text-bad">{error.message}</p>
      {fields.length > 0 && (
        <ul className="mt-2 max-h-64 list-disc overflow-y-auto pl-5">
          {fields.map((f, i) => (
            <li key={i}>
              <span className="font-mono text-xs">{f.path}</span>: {f.message}
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
