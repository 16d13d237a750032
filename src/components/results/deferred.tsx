"use client";
import { useEffect, useState, type ReactNode } from "react";

/**
 * Renders its children one task after it mounts (nothing before): a chart's long table for screen readers —
 * hundreds of rows nobody sees — or the closure strip under the time–distance chart then costs its own
 * main-thread task instead of lengthening the chart's.
 */
export function Deferred({ children }: { children: ReactNode }) {
  const [ready, setReady] = useState(false);
  useEffect(() => {
    const timer = setTimeout(() => setReady(true), 0);
    return () => clearTimeout(timer);
  }, []);
  return ready ? <>{children}</> : null;
}
