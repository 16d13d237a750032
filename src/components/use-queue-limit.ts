"use client";
/**
 * The queue limit a traffic engineer checks closures against (miles of queue, optionally minutes of delay):
 * a setting of the person, kept in this browser, not part of the scenario — two engineers may hold a plan to
 * different limits without changing it. Default 1 mile (common practice, no published source).
 */
import { useCallback, useSyncExternalStore } from "react";
import { DEFAULT_QUEUE_LIMIT, type QueueLimit } from "@sim/advisor";

const KEY = "pourline.queueLimit";
const listeners = new Set<() => void>();
let cachedRaw: string | null | undefined;
let cached: QueueLimit = DEFAULT_QUEUE_LIMIT;

/** A stored value that is not a sensible limit falls back to the default rather than hiding every warning. */
export function parseQueueLimit(raw: string | null): QueueLimit {
  try {
    const v = raw ? JSON.parse(raw) : null;
    const miles = Number(v?.miles);
    const minutes = v?.minutes === undefined || v?.minutes === null ? undefined : Number(v.minutes);
    if (!(miles > 0 && miles <= 100)) return DEFAULT_QUEUE_LIMIT;
    return minutes !== undefined && minutes > 0 && minutes <= 600 ? { miles, minutes } : { miles };
  } catch {
    return DEFAULT_QUEUE_LIMIT;
  }
}

function read(): QueueLimit {
  const raw = typeof window === "undefined" ? null : window.localStorage.getItem(KEY);
  if (raw !== cachedRaw) {
    cachedRaw = raw;
    cached = parseQueueLimit(raw);
  }
  return cached;
}

function subscribe(fn: () => void) {
  listeners.add(fn);
  const onStorage = (e: StorageEvent) => e.key === KEY && fn();
  window.addEventListener("storage", onStorage);
  return () => {
    listeners.delete(fn);
    window.removeEventListener("storage", onStorage);
  };
}

export function useQueueLimit(): [QueueLimit, (next: QueueLimit) => void] {
  const limit = useSyncExternalStore(subscribe, read, () => DEFAULT_QUEUE_LIMIT);
  const set = useCallback((next: QueueLimit) => {
    window.localStorage.setItem(KEY, JSON.stringify(next));
    for (const fn of listeners) fn();
  }, []);
  return [limit, set];
}

export function describeLimit(l: QueueLimit): string {
  const mi = `${l.miles} mile${l.miles === 1 ? "" : "s"}`;
  return l.minutes !== undefined ? `${mi} or ${l.minutes} minutes of delay` : mi;
}
