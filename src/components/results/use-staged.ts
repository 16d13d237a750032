"use client";
import { useEffect, useState } from "react";

/**
 * Hands a new value to `count` consumers one at a time, each in its own task after a frame: the results view
 * gives its charts a new summary chart by chart, so no single main-thread task draws them all (the Long Tasks limit of
 * the browser benchmark is 100 ms). Slot i holds the value slot i was last given — null before the first,
 * which the view draws as a placeholder of the chart's height (also on the server, so hydration matches).
 * Each step starts from the effect of the previous commit, so React never batches two steps into one render.
 * `enabled` false (the printed brief): every slot holds the value at once.
 */
export function useStaged<T>(value: T, count: number, enabled = true): (T | null)[] {
  const [slots, setSlots] = useState<(T | null)[]>(() => new Array(count).fill(enabled ? null : value));
  const next = enabled ? slots.findIndex((v) => v !== value) : -1;
  useEffect(() => {
    if (next < 0) return;
    // After the next frame, not merely the next task: recharts hands its store's updates to
    // requestAnimationFrame, so a chart mounted before the frame has run its predecessor's updates would add
    // its own to that same frame — one task for two charts' second render.
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => {
      timer = setTimeout(() => setSlots((prev) => prev.map((v, i) => (i === next ? value : v))), 0);
    });
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(timer);
    };
  }, [next, value]);
  return enabled ? slots : new Array(count).fill(value);
}
