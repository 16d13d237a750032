"use client";
/**
 * The holiday trade-off in one click (./use-tradeoff runs both policies in a Web Worker) — the panel states
 * what working through gains in days against the extra delay and road-user cost, with a small chart of delay
 * under each policy.
 */
import { Bar, BarChart, CartesianGrid, ResponsiveContainer, XAxis, YAxis } from "recharts";
import type { HolidayTradeoff } from "@sim/tradeoff";
import { formatIsoDate } from "@/lib/format";
import { AXIS_TICK, GRID_STROKE } from "./chart-style";
import { TradeoffTable } from "./tradeoff-table";
import { useTradeoff } from "./use-tradeoff";
import { ChartLegend } from "./legend-swatch";

const vh = (v: number | null) => (v === null ? "—" : `${Math.round(v).toLocaleString("en-US")} vehicle-hours`);
const money = (v: number | null) => (v === null ? "—" : `$${Math.round(Math.abs(v)).toLocaleString("en-US")}`);
const dayWord = (n: number) => `${Math.abs(n).toLocaleString("en-US")} day${Math.abs(n) === 1 ? "" : "s"}`;
const dateText = (d: string) => (d === "unfinished" ? "not within the horizon" : formatIsoDate(d));

/** The trade-off as one plain sentence (P50, with P80 in brackets). */
export function tradeoffSentence(t: HolidayTradeoff): string {
  const g50 = t.daysGained.p50;
  const g80 = t.daysGained.p80;
  if (g50 === null || g80 === null) return "Some finishes fall beyond the engine’s horizon under one of the policies, so the days gained cannot be stated.";
  const when = g50 > 0 ? `finishes ${dayWord(g50)} sooner at P50` : g50 < 0 ? `finishes ${dayWord(g50)} later at P50` : "finishes on the same day at P50";
  const p80 = g80 > 0 ? `${dayWord(g80)} sooner at P80` : g80 < 0 ? `${dayWord(g80)} later at P80` : "the same day at P80";
  const head = `Working through holidays ${when} (${p80}; P50 ${dateText(t.workThrough.finish.p50)} instead of ${dateText(t.standDown.finish.p50)})`;
  const tail = [targetClause(t), contractClause(t)].filter(Boolean).join(" ");
  const end = tail ? ` ${tail}` : "";
  if (!t.hasTraffic) return `${head}. The plan has no traffic profile, so its cost to drivers is not estimated.${end}`;
  const d = t.extraDelayVehHours.p50;
  const c = t.extraRoadUserCost.p50;
  if (d === null) return `${head}.${end}`;
  const more = d >= 0 ? `${vh(d)} more delay` : `${vh(-d)} less delay`;
  return `${head}, for ${more} to drivers at P50 (${money(c)} of road-user cost ${d >= 0 ? "added" : "saved"}).${end}`;
}

/** "The chance of meeting the 30 Jun 2027 target rises from 48 % to 61 %." (empty without a target) */
function targetClause(t: HolidayTradeoff): string {
  const a = t.standDown.targetProbability;
  const b = t.workThrough.targetProbability;
  if (a === null || b === null || t.targetDate === null) return "";
  const pct = (x: number) => `${Math.round(x * 100)} %`;
  const verb = b > a ? "rises" : b < a ? "falls" : "stays";
  return b === a ? `The chance of meeting the ${formatIsoDate(t.targetDate)} target stays at ${pct(a)}.` : `The chance of meeting the ${formatIsoDate(t.targetDate)} target ${verb} from ${pct(a)} to ${pct(b)}.`;
}

/** "The contract costs $41,000 more at P50." (empty without a costs section) */
function contractClause(t: HolidayTradeoff): string {
  const c = t.extraContractCost.p50;
  if (c === null) return "";
  if (c === 0) return "The contract cost is the same at P50.";
  return `The contract costs ${money(c)} ${c > 0 ? "more" : "less"} at P50.`;
}

export function TradeoffPanel({ definition, seed, iterations }: { definition: unknown; seed: string; iterations: number }) {
  const { state, run, n } = useTradeoff(definition, seed, iterations);

  return (
    <div className="space-y-3" data-testid="tradeoff-panel">
      <div className="flex flex-wrap items-center gap-3">
        <button type="button" className="btn-primary" onClick={run} disabled={state.phase === "running"} data-testid="tradeoff-run">
          {state.phase === "running" ? "Comparing…" : state.phase === "done" ? "Compare again" : "Compare holiday policies"}
        </button>
        <span className="text-sm text-muted">
          Runs this plan twice in your browser on seed “{seed}”, {n.toLocaleString("en-US")} iterations each: standing down over holidays and working through them.
        </span>
      </div>
      <div aria-live="polite">
        {state.phase === "running" && <p className="text-sm text-muted" data-testid="tradeoff-running">Running both policies…</p>}
        {state.phase === "failed" && (
          <p className="text-sm text-bad" role="alert" data-testid="tradeoff-error">
            Could not compare the policies: {state.message}
          </p>
        )}
        {state.phase === "done" && (
          <p className="text-base leading-relaxed" data-testid="tradeoff-sentence">
            {tradeoffSentence(state.result)}
          </p>
        )}
      </div>
      {state.phase === "done" && <TradeoffTable t={state.result} />}
      {state.phase === "done" && state.result.hasTraffic && <TradeoffChart t={state.result} />}
    </div>
  );
}

function TradeoffChart({ t }: { t: HolidayTradeoff }) {
  const data = [
    { policy: "Stand down", p50: t.standDown.delayVehHours.p50 ?? 0, p80: t.standDown.delayVehHours.p80 ?? 0, finish: t.standDown.finish.p50 },
    { policy: "Work through", p50: t.workThrough.delayVehHours.p50 ?? 0, p80: t.workThrough.delayVehHours.p80 ?? 0, finish: t.workThrough.finish.p50 },
  ];
  return (
    <figure className="m-0 max-w-xl" aria-label={`Delay to drivers under each holiday policy: standing down ${vh(t.standDown.delayVehHours.p50)} at P50, working through ${vh(t.workThrough.delayVehHours.p50)} at P50. The same figures are in the table that follows.`} data-testid="tradeoff-chart">
      <div aria-hidden="true">
        <ResponsiveContainer width="100%" height={200} initialDimension={{ width: 500, height: 200 }}>
          <BarChart data={data} margin={{ top: 8, right: 16, bottom: 8, left: 8 }} accessibilityLayer={false}>
            <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" vertical={false} />
            <XAxis dataKey="policy" tick={AXIS_TICK} />
            <YAxis tick={AXIS_TICK} width={72} tickFormatter={(v: number) => v.toLocaleString("en-US")} label={{ value: "Delay (veh-h)", angle: -90, position: "insideLeft", dy: 40, fill: "var(--color-ink)", fontSize: 12 }} />
            <Bar dataKey="p50" name="P50" fill="var(--color-s5)" isAnimationActive={false} />
            <Bar dataKey="p80" name="P80" fill="var(--color-s1)" isAnimationActive={false} />
          </BarChart>
        </ResponsiveContainer>
        {/* The legend in ink with colour samples, as on the other charts (the library's wrote "P80" in amber). */}
        <div className="mt-1">
          <ChartLegend items={[{ label: "P50", fill: "var(--color-s5)" }, { label: "P80", fill: "var(--color-s1)" }]} />
        </div>
      </div>
      <div className="sr-only">
        <table>
          <caption>Holiday policies compared</caption>
          <thead>
            <tr>
              <th scope="col">Policy</th>
              <th scope="col">P50 finish</th>
              <th scope="col">Delay P50 (veh-h)</th>
              <th scope="col">Delay P80 (veh-h)</th>
            </tr>
          </thead>
          <tbody>
            {data.map((d) => (
              <tr key={d.policy}>
                <td>{d.policy}</td>
                <td>{dateText(d.finish)}</td>
                <td>{Math.round(d.p50)}</td>
                <td>{Math.round(d.p80)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </figure>
  );
}
