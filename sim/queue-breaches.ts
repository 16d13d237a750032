/**
 * Days whose longest queue broke a limit, per iteration (the CLI's `queueLimitBreaches`). Contract:
 * `queueBreachCounter(compiled, limit)` gives a reader to pass to `runIterations` as `afterIteration`:
 * it walks that iteration's queues again with per-day detail (./cost, ./traffic) and counts the days on which
 * the longest queue of any direction broke the limit (./queue-limit: miles of queue, or minutes of delay of the
 * vehicle at its end); `quantiles()` gives P50/P80 over the iterations read (nearest rank). Kept out of the
 * Monte Carlo columns so runs that do not ask pay nothing.
 */
import { impactModel, iterationImpact, type ImpactDetail } from "./cost";
import type { CompiledScenario, SimResult } from "./engine";
import { nearestRank, sortedCopy } from "./percentiles";
import { breaksLimit, type QueueLimit } from "./queue-limit";

export interface QueueLimitBreaches {
  limit: QueueLimit;
  p50: number;
  p80: number;
  /** Share of iterations with at least one such day. */
  anyShare: number;
}

export function queueBreachCounter(c: CompiledScenario, limit: QueueLimit) {
  const m = impactModel(c);
  const counts: number[] = [];
  const read = (_k: number, r: SimResult) => {
    if (!m?.traffic) return;
    const t = m.traffic;
    const detail: ImpactDetail = { perDirection: [] };
    iterationImpact(c, m, r, detail);
    let n = 0;
    for (let d = 0; d < t.days; d++) {
      const broke = t.directions.some((dir, i) => {
        const q = detail.perDirection[i];
        return breaksLimit(limit, { miles: (q.peakQueue[d] * dir.pcPerVeh) / (t.jamDensity * dir.storageLanes), minutes: q.peakDelayMinutes[d] }) === true;
      });
      if (broke) n++;
    }
    counts.push(n);
  };
  const quantiles = (): QueueLimitBreaches | null => {
    if (!m?.traffic || counts.length === 0) return null;
    const sorted = sortedCopy(Float64Array.from(counts));
    return { limit, p50: nearestRank(sorted, 0.5), p80: nearestRank(sorted, 0.8), anyShare: counts.filter((x) => x > 0).length / counts.length };
  };
  return { read, quantiles };
}

/**
 * The longest queue on holiday-peak days (MODEL.md, "Traffic": demand kind `holidayPeak`), miles, per
 * iteration — for the holiday trade-off's "longest holiday backup". Same reading rules as `queueBreachCounter`.
 */
export function holidayBackupReader(c: CompiledScenario) {
  const m = impactModel(c);
  const longest: number[] = [];
  const read = (_k: number, r: SimResult) => {
    if (!m?.traffic) return;
    const t = m.traffic;
    const detail: ImpactDetail = { perDirection: [] };
    iterationImpact(c, m, r, detail);
    let best = 0;
    for (let d = 0; d < t.days; d++) {
      if (t.dayKind[d] !== 4) continue;
      t.directions.forEach((dir, i) => {
        const mi = (detail.perDirection[i].peakQueue[d] * dir.pcPerVeh) / (t.jamDensity * dir.storageLanes);
        if (mi > best) best = mi;
      });
    }
    longest.push(best);
  };
  const quantiles = (): { p50: number; p80: number } | null => {
    if (!m?.traffic || longest.length === 0) return null;
    const sorted = sortedCopy(Float64Array.from(longest));
    return { p50: Math.round(nearestRank(sorted, 0.5) * 100) / 100, p80: Math.round(nearestRank(sorted, 0.8) * 100) / 100 };
  };
  return { read, quantiles };
}
