"use client";
import { useSyncExternalStore } from "react";

/** Below Tailwind's `sm` breakpoint (640 px): a phone held upright. */
const NARROW = "(max-width: 639.98px)";

function subscribe(onChange: () => void) {
  const list = window.matchMedia(NARROW);
  list.addEventListener("change", onChange);
  return () => list.removeEventListener("change", onChange);
}

/**
 * Whether the screen is phone-narrow, for the few layouts CSS alone cannot rearrange (a grid that reads by day on a
 * phone, by row on a desktop). False while rendering on the server; follows the screen as it turns.
 */
export function useNarrowScreen(): boolean {
  return useSyncExternalStore(
    subscribe,
    () => window.matchMedia(NARROW).matches,
    () => false,
  );
}
