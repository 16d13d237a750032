"use client";
/** Which stages the time–distance chart draws: all of them, or one (with its lanes and P50 restoration). */
import type { RunSummary } from "@sim/summary";
import { stageLabel } from "@/lib/stage-text";
import { quantileText } from "./summary-text";
import type { StageInfo } from "./stage-series";

export function StageSelector({ stages, finishes, value, onChange }: { stages: StageInfo[]; finishes: RunSummary["stages"]; value: string; onChange: (id: string) => void }) {
  const finishOf = new Map(finishes.map((f) => [f.id, f.finish.p50]));
  const options = [{ id: "all", label: "All stages", detail: `${stages.length} stages` }, ...stages.map((st, i) => ({ id: st.id, label: stageLabel(st.name, i), detail: [st.lanes?.length ? `lanes ${st.lanes.join(", ")}` : "", finishOf.has(st.id) ? `restored P50 ${quantileText(finishOf.get(st.id)!)}` : ""].filter(Boolean).join(" · ") }))];
  return (
    <fieldset className="mb-3" data-testid="stage-selector">
      <legend className="mb-1 text-xs font-medium text-muted">Show</legend>
      <div className="flex flex-wrap gap-2">
        {options.map((o) => {
          const on = o.id === value;
          return (
            <label key={o.id} className={`cursor-pointer rounded-md border px-3 py-1.5 text-sm has-[:focus-visible]:ring-2 has-[:focus-visible]:ring-brand-600 ${on ? "border-brand-600 bg-brand-50 text-brand-800" : "border-line bg-white hover:bg-brand-50"}`}>
              <input type="radio" name="time-distance-stage" value={o.id} checked={on} onChange={() => onChange(o.id)} className="sr-only" />
              <span className="font-medium">{o.label}</span>
              {o.detail && <span className="block text-xs text-muted">{o.detail}</span>}
            </label>
          );
        })}
      </div>
    </fieldset>
  );
}
