"use client";
/** Section 4: the 12-month climate profile as an editable table, a chart of it, and the weather mode. */
import { useWatch, useFormContext } from "react-hook-form";
import { Bar, CartesianGrid, ComposedChart, Line, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import { AXIS_TICK, GRID_STROKE } from "@/components/results/chart-style";
import { ChartLegend } from "@/components/results/legend-swatch";
import type { ScenarioInput } from "@sim/schema";
import { NumberField, SelectField } from "./fields";
import { monthName } from "@/lib/format";

const MONTHS = Array.from({ length: 12 }, (_, i) => monthName(i + 1, true));

const COLUMNS = [
  { key: "tmaxMeanF", label: "Tmax mean °F" },
  { key: "tmaxSdF", label: "Tmax sd °F" },
  { key: "tminMeanF", label: "Tmin mean °F" },
  { key: "tminSdF", label: "Tmin sd °F" },
  { key: "pWetAfterDry", label: "P(wet | dry)" },
  { key: "pWetAfterWet", label: "P(wet | wet)" },
  { key: "windMeanMph", label: "Wind mean mph" },
  { key: "rhMean", label: "RH mean %" },
] as const;

/**
 * Long-run share of wet days of a two-state Markov chain: π = P(W|D) / (1 − P(W|W) + P(W|D)).
 * Source: CLIGEN documentation (Nicks, Lane & Gander 1995), as listed in SOURCES.md.
 */
function wetShare(pwd: number, pww: number): number | null {
  const d = 1 - pww + pwd;
  return Number.isFinite(pwd) && Number.isFinite(pww) && d > 0 ? pwd / d : null;
}

export function WeatherSection() {
  const { control } = useFormContext<ScenarioInput>();
  const monthly = useWatch({ control, name: "weather.monthly" }) ?? [];
  const data = MONTHS.map((m, i) => {
    const r = monthly[i];
    const share = r ? wetShare(r.pWetAfterDry, r.pWetAfterWet) : null;
    return {
      month: m.slice(0, 3),
      tmax: Number.isFinite(r?.tmaxMeanF) ? r.tmaxMeanF : null,
      tmin: Number.isFinite(r?.tminMeanF) ? r.tminMeanF : null,
      wet: share === null ? null : Math.round(share * 1000) / 10,
    };
  });

  return (
    <div className="space-y-5">
      <section className="card" aria-labelledby="weather-mode-heading">
        <h2 id="weather-mode-heading">Weather model</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-3">
          <SelectField
            name="weather.mode"
            label="Mode"
            hint="Stochastic draws daily weather from the profile; fixed uses the monthly means with no rain."
            options={[
              { value: "stochastic", label: "Stochastic (daily weather drawn)" },
              { value: "fixed", label: "Fixed (monthly means, dry)" },
            ]}
          />
          <NumberField name="weather.wetTmaxShiftF" label="Wet-day Tmax shift (°F)" />
          <NumberField name="weather.wetTminShiftF" label="Wet-day Tmin shift (°F)" />
          <NumberField name="weather.serialCorrelation" label="Day-to-day temperature correlation" min={0} max={0.95} step="0.05" />
          <NumberField name="weather.rainHoursMean" label="Mean rain hours on a wet day" min={1} max={24} />
        </div>
      </section>

      <section className="card" aria-labelledby="climate-chart-heading">
        <h2 id="climate-chart-heading">Climate profile</h2>
        <p className="mt-1 text-sm text-muted">Lines: mean daily high and low (°F, left axis). Bars: long-run share of wet days (%, right axis).</p>
        {/* Axes and legend as on the results charts (12 px, legend below in ink): the library's defaults drew
            larger grey axes and a legend in the series' own colours, the light blue one hard to read. */}
        <figure className="mt-3" aria-label="Chart of mean high and low temperature and wet-day share by month; the same values are in the table below">
          <div className="h-72" aria-hidden="true">
            <ResponsiveContainer width="100%" height="100%">
              <ComposedChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }} accessibilityLayer={false}>
                <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" />
                <XAxis dataKey="month" tick={AXIS_TICK} label={{ value: "Month", position: "insideBottom", offset: -14, fill: "var(--color-ink)", fontSize: 12 }} />
                <YAxis yAxisId="t" tick={AXIS_TICK} label={{ value: "Temperature (°F)", angle: -90, position: "insideLeft", dy: 50, fill: "var(--color-ink)", fontSize: 12 }} />
                <YAxis yAxisId="p" orientation="right" domain={[0, 100]} tick={AXIS_TICK} label={{ value: "Wet days (%)", angle: 90, position: "insideRight", dy: 35, fill: "var(--color-ink)", fontSize: 12 }} />
                <Tooltip />
                <Bar yAxisId="p" dataKey="wet" name="Wet days (%)" fill="var(--color-s2)" />
                <Line yAxisId="t" dataKey="tmax" name="Mean high (°F)" stroke="var(--color-s6)" strokeWidth={2} dot />
                <Line yAxisId="t" dataKey="tmin" name="Mean low (°F)" stroke="var(--color-s5)" strokeWidth={2} strokeDasharray="5 3" dot />
              </ComposedChart>
            </ResponsiveContainer>
          </div>
          <figcaption className="mt-2">
            <ChartLegend
              items={[
                { label: "Mean high (°F)", line: { stroke: "var(--color-s6)" } },
                { label: "Mean low (°F)", line: { stroke: "var(--color-s5)", strokeDasharray: "5 3" } },
                { label: "Wet days (%)", fill: "var(--color-s2)" },
              ]}
            />
          </figcaption>
        </figure>
      </section>

      <section className="card scroll-x p-0" aria-labelledby="climate-table-heading">
        <h2 id="climate-table-heading" className="px-5 py-4">
          Monthly values
        </h2>
        <table className="w-full min-w-[1000px] border-collapse" data-testid="climate-table">
          <thead>
            <tr>
              <th scope="col" className="table-head">Month</th>
              {COLUMNS.map((c) => (
                <th key={c.key} scope="col" className="table-head">
                  {c.label}
                </th>
              ))}
            </tr>
          </thead>
          <tbody>
            {MONTHS.map((m, i) => (
              <tr key={m} className="align-top">
                <th scope="row" className="table-cell text-left font-medium">
                  {m}
                </th>
                {COLUMNS.map((c) => (
                  <td key={c.key} className="table-cell">
                    <NumberField name={`weather.monthly.${i}.${c.key}`} label={`${m} ${c.label}`} hideLabel step={c.key.startsWith("pWet") ? "0.01" : "any"} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </div>
  );
}
