"use client";
/**
 * The closure-hours advisor in the Traffic section: for the plan as edited (unsaved edits included), the
 * plan's queue limit (miles of queue or minutes of delay, `traffic.queueLimit`), warnings for every planned
 * window that lets the queue pass it, and for a chosen closure and day kind a 24-hour chart — bars: the longest
 * closure that may start at each hour with the queue under the limit; line: the planned window's queue (miles)
 * or delay (minutes), in the limit's unit — with the same facts in words for screen readers.
 */
import { useDeferredValue, useId, useMemo, useState } from "react";
import { useFormContext, useWatch } from "react-hook-form";
import { Bar, CartesianGrid, Cell, ComposedChart, Line, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { closureHoursAdvice, type ClosureAdvice } from "@sim/advisor";
import type { ScenarioInput } from "@sim/schema";
import { parseScenario } from "@sim/validate";
import { describeQueueLimit, queueLimitOf } from "@sim/queue-limit";
import { breachWarning, clock, DAY_KIND_LABEL, goodStartRuns, windowLabel } from "@/lib/closure-advice-text";
import { AXIS_TICK, GRID_STROKE } from "../results/chart-style";
import { ChartLegend } from "../results/legend-swatch";
import { NumberField, SelectField } from "./fields";

const keyOf = (a: ClosureAdvice) => `${a.closure}|${a.withStage ?? ""}`;

export function ClosureHoursAdvisor() {
  const { control } = useFormContext<ScenarioInput>();
  const values = useDeferredValue(useWatch({ control }) as ScenarioInput);
  const parsed = useMemo(() => parseScenario(values), [values]);
  const limit = parsed.ok ? queueLimitOf(parsed.scenario) : null;
  const advice = useMemo(() => (parsed.ok ? closureHoursAdvice(parsed.scenario) : []), [parsed]);
  const entries = useMemo(() => [...new Map(advice.map((a) => [keyOf(a), a.name])).entries()], [advice]);
  const [pick, setPick] = useState<{ entry: string; kind: string } | null>(null);
  const id = useId();
  const warnings = limit ? advice.map((a) => breachWarning(a, limit)).filter((w): w is string => w !== null) : [];

  if (!values?.traffic) return null;
  const limitFields = (
    <div className="mt-3 flex flex-wrap items-start gap-4" data-testid="queue-limit">
      <SelectField
        name="traffic.queueLimit.unit"
        label="Queue limit, measured as"
        options={[
          { value: "miles", label: "Miles of queue" },
          { value: "minutes", label: "Minutes of delay" },
        ]}
      />
      <NumberField name="traffic.queueLimit.value" label="Queue limit" hint="e.g. 1 mile of queue, or 15 minutes of delay" step="any" min={0.1} max={600} className="w-56" />
    </div>
  );
  const heading = (
    <>
      <h2 id={`${id}-heading`}>When each closure may stand</h2>
      <p className="mt-1 text-sm text-muted">
        From the hourly demand and each closure&apos;s capacity (the same rules as the delay figures), the hours that keep the queue under the plan&apos;s
        limit. The limit is part of the plan: results, the printed brief and the public advisory use it too. Delay is the wait of the last vehicle in the
        queue.
      </p>
      {limitFields}
    </>
  );
  if (!parsed.ok || !limit)
    return (
      <section className="card" aria-labelledby={`${id}-heading`} data-testid="closure-advisor">
        {heading}
        <p className="mt-3 text-sm text-muted">The closure-hours advice appears once the plan has no problems left to fix.</p>
      </section>
    );
  if (advice.length === 0) return null;
  // Open on the first warning, if any: that is what the engineer needs to look at.
  const firstBreach = advice.find((a) => a.planned?.breaks);
  const entry = pick?.entry ?? (firstBreach ? keyOf(firstBreach) : entries[0][0]);
  const kind = pick?.kind ?? (firstBreach && keyOf(firstBreach) === entry ? firstBreach.dayKind : "weekday");
  const chosen = advice.find((a) => keyOf(a) === entry && a.dayKind === kind) ?? advice[0];
  const plannedLength = chosen.planned ? Math.max(...chosen.planned.windows.map((w) => (w.end > w.start ? w.end - w.start : 24 - w.start + w.end))) : 1;
  const runs = goodStartRuns(chosen, Math.ceil(plannedLength));
  const inMinutes = limit.unit === "minutes";
  const lineName = inMinutes ? "Planned delay (min)" : "Planned queue (mi)";
  const data = chosen.hours.map((h) => ({
    hour: clock(h.hour).slice(0, 2),
    longest: h.longestClosureFrom,
    queue: inMinutes ? Math.round(Number.isFinite(h.plannedDelayMinutes) ? h.plannedDelayMinutes : 0) : Math.round(h.plannedQueueMiles * 100) / 100,
    fits: h.longestClosureFrom >= plannedLength,
  }));

  return (
    <section className="card" aria-labelledby={`${id}-heading`} data-testid="closure-advisor">
      {heading}

      {warnings.length > 0 ? (
        <div className="mt-4 rounded-md border border-bad bg-bad-bg p-3" data-testid="closure-advisor-warnings">
          <h3 className="text-bad">
            {warnings.length === 1 ? "1 planned window lets" : `${warnings.length} planned windows let`} the queue pass {describeQueueLimit(limit)}
          </h3>
          <ul className="mt-2 list-disc space-y-1 pl-5 text-sm">
            {warnings.map((w) => (
              <li key={w}>{w}</li>
            ))}
          </ul>
        </div>
      ) : (
        <p className="mt-4 text-sm" data-testid="closure-advisor-ok">
          Every planned closure window keeps the queue under {describeQueueLimit(limit)} on every kind of day.
        </p>
      )}

      <div className="mt-4 flex flex-wrap gap-4">
        <div>
          <label htmlFor={`${id}-entry`} className="field-label">
            Closure
          </label>
          <select id={`${id}-entry`} className="field-input" value={entry} onChange={(e) => setPick({ entry: e.target.value, kind })}>
            {entries.map(([key, name]) => (
              <option key={key} value={key}>
                {name}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor={`${id}-kind`} className="field-label">
            Day
          </label>
          <select id={`${id}-kind`} className="field-input" value={kind} onChange={(e) => setPick({ entry, kind: e.target.value })}>
            {Object.entries(DAY_KIND_LABEL).map(([k, label]) => (
              <option key={k} value={k}>
                {label[0].toUpperCase() + label.slice(1)}
              </option>
            ))}
          </select>
        </div>
      </div>
      <p className="mt-3 text-sm" data-testid="closure-advisor-summary">
        {chosen.planned
          ? `Planned ${chosen.planned.windows.map((w) => windowLabel(w, chosen.kind)).join(" and ")}: longest queue ${chosen.planned.peakQueueMiles.toFixed(1)} mi around ${clock(chosen.planned.peakHour)}, ${Number.isFinite(chosen.planned.peakDelayMinutes) ? `up to ${Math.round(chosen.planned.peakDelayMinutes)} minutes of delay` : "no way through"}${chosen.planned.breaks ? " — over the limit." : " — within the limit."} `
          : "No planned window on these days. "}
        {chosen.kind === "short" &&
          (runs.length === 0
            ? `No start hour keeps a ${Math.ceil(plannedLength)}-hour closure under the limit on these days.`
            : `A ${Math.ceil(plannedLength)}-hour closure keeps under the limit when it starts ${runs[0] === "any hour" ? "at any hour" : `between ${runs.join(", ")}`}.`)}
      </p>
      <figure className="m-0 mt-2" aria-label={`Chart for ${chosen.name} on ${DAY_KIND_LABEL[chosen.dayKind]}: bars are the longest closure in hours that may start at each hour of the day with the queue under the limit; the line is the planned window's ${inMinutes ? "delay in minutes" : "queue in miles"}. The sentence above says the same.`}>
        <div aria-hidden="true">
          <ResponsiveContainer width="100%" height={240} initialDimension={{ width: 700, height: 240 }}>
            <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }} accessibilityLayer={false}>
              <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" vertical={false} />
              <XAxis dataKey="hour" tick={AXIS_TICK} label={{ value: "Start hour", position: "insideBottom", offset: -14, fill: "var(--color-ink)", fontSize: 12 }} />
              <YAxis yAxisId="h" tick={AXIS_TICK} width={48} domain={[0, 24]} ticks={[0, 6, 12, 18, 24]} label={{ value: "Longest closure (h)", angle: -90, position: "insideLeft", dy: 50, fill: "var(--color-ink)", fontSize: 12 }} />
              <YAxis yAxisId="mi" orientation="right" tick={AXIS_TICK} width={48} label={{ value: lineName, angle: 90, position: "insideRight", dy: 50, fill: "var(--color-ink)", fontSize: 12 }} />
              <Tooltip />
              <Bar yAxisId="h" dataKey="longest" name="Longest closure from this hour (h)" isAnimationActive={false}>
                {data.map((d) => (
                  <Cell key={d.hour} fill={d.fits ? "var(--color-s3)" : "var(--color-s1)"} />
                ))}
              </Bar>
              <Line yAxisId="mi" dataKey="queue" name={lineName} stroke="var(--color-s6)" strokeWidth={2} dot={false} isAnimationActive={false} />
              <ReferenceLine yAxisId="mi" y={limit.value} stroke="var(--color-bad)" strokeDasharray="6 3" label={{ value: "limit", position: "right", fill: "var(--color-bad)", fontSize: 11 }} />
            </ComposedChart>
          </ResponsiveContainer>
        </div>
        {/* The bars' two colours say whether the planned length fits; the library's legend showed one black square for both. */}
        <figcaption className="mt-2">
          <ChartLegend
            items={[
              { label: `Longest closure from this hour: the planned ${Math.ceil(plannedLength)} h fit`, fill: "var(--color-s3)" },
              { label: `… shorter than the planned ${Math.ceil(plannedLength)} h`, fill: "var(--color-s1)" },
              { label: `${lineName}, planned window`, line: { stroke: "var(--color-s6)" } },
              { label: "The plan's limit", line: { stroke: "var(--color-bad)", strokeDasharray: "6 3" } },
            ]}
          />
        </figcaption>
      </figure>
    </section>
  );
}
