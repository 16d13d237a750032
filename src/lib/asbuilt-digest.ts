/** What a re-forecast stores about its as-built state beside the run summary (pure: the worker computes it). */
import type { AsBuiltState } from "@sim/asbuilt";
import type { Scenario } from "@sim/schema";

export function asBuiltDigest(plan: Scenario, st: AsBuiltState) {
  const mean = (a: number[]) => (a.length ? a.reduce((x, y) => x + y, 0) / a.length : 0);
  return {
    dataDate: st.dataDate,
    entriesUsed: st.entriesUsed,
    operations: st.ops.map((o, i) => ({
      id: o.id,
      name: plan.operations[i].name,
      donePackets: o.remaining.filter((r) => r === 0).length,
      partPackets: o.remaining.filter((r) => r > 0 && r < 1).length,
      packets: o.remaining.length,
    })),
    curingPackets: st.curing.length,
    discovered: st.discovered,
    discovery: { priorPackets: st.discovery.priorPackets, inspected: st.discovery.inspected, found: st.discovery.found, planMean: mean(st.discovery.prior), updatedMean: mean(st.discovery.updated) },
  };
}
