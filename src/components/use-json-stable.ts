"use client";
import { useMemo } from "react";

/**
 * The same object for the same JSON: props that arrive again from the server (a page refresh re-creates every
 * object) keep their identity while their content is unchanged, so memoised children do not redraw.
 */
export function useJsonStable<T>(value: T): T {
  const json = JSON.stringify(value) ?? "";
  // eslint-disable-next-line react-hooks/exhaustive-deps -- keyed on the content on purpose
  return useMemo(() => value, [json]);
}
