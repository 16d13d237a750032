"use client";
/**
 * Section 5: traffic and costs. The hourly demand profile of each direction as an editable table (24 hours ×
 * five day kinds) with a chart of it, the capacity method and its inputs, per-closure work intensity or a
 * capacity override, and the cost inputs. Both parts are optional in the scenario: "Add" fills in an invented
 * starting profile the engineer then edits; "Remove" takes the part out (the plan then has no delay or cost).
 */
import { useFormContext, useWatch } from "react-hook-form";
import { CartesianGrid, Line, LineChart, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { ScenarioInput } from "@sim/schema";
import { DEFAULT_QUEUE_LIMIT } from "@sim/queue-limit";
import { ClosureHoursAdvisor } from "./closure-hours-advisor";
import { CheckboxField, n, NumberField, SelectField, TextField } from "./fields";
import { AXIS_TICK, GRID_STROKE } from "@/components/results/chart-style";
import { ChartLegend } from "@/components/results/legend-swatch";
import { formatHour } from "@/lib/format";

const KINDS = [
  { key: "weekday", label: "Mon–Thu" },
  { key: "friday", label: "Friday" },
  { key: "saturday", label: "Saturday" },
  { key: "sunday", label: "Sunday" },
  { key: "holidayPeak", label: "Holiday peak" },
] as const;

const HOURS = Array.from({ length: 24 }, (_, h) => formatHour(h));

/** An invented two-peak weekday shape (share of the peak hour), scaled per day kind; a starting point only. */
const SHAPE = [0.09, 0.06, 0.05, 0.05, 0.09, 0.24, 0.57, 0.93, 1, 0.78, 0.63, 0.61, 0.63, 0.63, 0.67, 0.8, 0.96, 1, 0.8, 0.57, 0.41, 0.33, 0.23, 0.15];

function starterProfile(peakPerLane: number, lanes: number): Record<(typeof KINDS)[number]["key"], number[]> {
  const scale = (f: number, flatten = 0) => SHAPE.map((s) => Math.round((s * (1 - flatten) + flatten * 0.75) * peakPerLane * lanes * f));
  return { weekday: scale(1), friday: scale(1.04, 0.2), saturday: scale(0.7, 0.6), sunday: scale(0.66, 0.6), holidayPeak: scale(0.85, 0.7) };
}

function starterTraffic(v: ScenarioInput): NonNullable<ScenarioInput["traffic"]> {
  const lanes = v.deck?.lanes?.length ? v.deck.lanes : ["L1"];
  return {
    method: "krammesLopez",
    directions: [{ id: "main", name: "Main direction", lanes: [...lanes], heavyVehicleShare: 0.1, demand: starterProfile(1400, lanes.length) }],
    closures: (v.calendar?.closures ?? []).map((c) => ({ closure: c.id, workIntensityPcPerHourPerLane: 0, barrier: "cones" as const, night: false })),
    queueLimit: { ...DEFAULT_QUEUE_LIMIT },
  };
}

const STARTER_COSTS: NonNullable<ScenarioInput["costs"]> = {
  valueOfTime: { year: 2015, carPerVehHour: 21.15, truckPerVehHour: 27.2 },
  fieldCostPerDay: 0,
  mobilizationPerSeason: 0,
  winterProtectionPerWinter: 0,
  incentivePerDay: 0,
  disincentivePerDay: 0,
};

export function TrafficSection({ readOnly }: { readOnly: boolean }) {
  const { control, setValue, getValues } = useFormContext<ScenarioInput>();
  const traffic = useWatch({ control, name: "traffic" });
  const costs = useWatch({ control, name: "costs" });
  const closures = useWatch({ control, name: "calendar.closures" }) ?? [];
  const set = (name: "traffic" | "costs", value: unknown) => setValue(n(name), value as never, { shouldDirty: true, shouldValidate: true });

  return (
    <div className="space-y-5" data-testid="traffic-section">
      <section className="card" aria-labelledby="traffic-model-heading">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 id="traffic-model-heading">Traffic model</h2>
          {!readOnly &&
            (traffic ? (
              <button type="button" className="btn-danger" data-testid="traffic-remove" onClick={() => set("traffic", undefined)}>
                Remove traffic profile
              </button>
            ) : (
              <button type="button" className="btn-primary" data-testid="traffic-add" onClick={() => set("traffic", starterTraffic(getValues()))}>
                Add a traffic profile
              </button>
            ))}
        </div>
        {!traffic ? (
          <p className="mt-2 text-sm text-muted" data-testid="traffic-empty">
            This plan has no traffic profile, so runs report no queues, delay or road-user cost. Adding one fills in an invented profile to edit.
          </p>
        ) : (
          <div className="mt-3 grid gap-4 sm:grid-cols-3">
            <SelectField
              name="traffic.method"
              label="Work-zone capacity method"
              hint="Krammes & Lopez (1994) for short-term closures; HCM 6th ed. queue discharge rate."
              options={[
                { value: "krammesLopez", label: "Krammes & Lopez (1994)" },
                { value: "hcm6", label: "HCM 6th ed. (queue discharge)" },
              ]}
            />
            <NumberField name="traffic.basePcPerHourPerLane" label="Base capacity (pc/h/ln)" hint="Krammes & Lopez: 1,600." />
            <NumberField name="traffic.truckPce" label="Truck equivalent E_T (pc)" step="0.1" />
            <NumberField name="traffic.openRoadPcPerHourPerLane" label="Queue discharge, all lanes open (pc/h/ln)" />
            <NumberField name="traffic.jamDensityPcPerMiPerLane" label="Jam density (pc/mi/ln)" hint="HCM: 190." />
            <SelectField name="traffic.areaType" label="Area type (HCM)" options={[{ value: "urban", label: "Urban" }, { value: "rural", label: "Rural" }]} />
            <NumberField name="traffic.lateralClearanceFt" label="Lateral clearance (ft, HCM)" min={0} max={12} />
          </div>
        )}
      </section>

      {traffic?.directions?.map((d, di) => <DirectionDemand key={di} index={di} name={d.name} />)}

      {traffic && (
        <section className="card scroll-x" aria-labelledby="traffic-closures-heading">
          <h2 id="traffic-closures-heading">Capacity under each closure</h2>
          <p className="mt-1 text-sm text-muted">Work intensity I lowers (heavy work, −160) or raises (light work, +160) capacity per open lane. An override replaces the method: veh/h through the closure for each direction it narrows, e.g. two-way operation on a parallel span.</p>
          <table className="mt-3 w-full min-w-[720px] border-collapse" data-testid="traffic-closures-table">
            <thead>
              <tr>
                <th scope="col" className="table-head">Closure</th>
                <th scope="col" className="table-head">Work intensity I (pc/h/ln)</th>
                <th scope="col" className="table-head">Barrier (HCM)</th>
                <th scope="col" className="table-head">Night (HCM)</th>
                <th scope="col" className="table-head">Override (veh/h)</th>
              </tr>
            </thead>
            <tbody>
              {(traffic.closures ?? []).map((c, ci) => {
                const name = closures.find((x) => x.id === c.closure)?.name ?? c.closure;
                return (
                  <tr key={`${c.closure}-${ci}`} className="align-top">
                    <th scope="row" className="table-cell text-left font-medium">{name}</th>
                    <td className="table-cell"><NumberField name={`traffic.closures.${ci}.workIntensityPcPerHourPerLane`} label={`${name} work intensity`} hideLabel min={-160} max={160} /></td>
                    <td className="table-cell"><SelectField name={`traffic.closures.${ci}.barrier`} label={`${name} barrier`} hideLabel options={[{ value: "cones", label: "Cones or drums" }, { value: "concrete", label: "Concrete barrier" }]} /></td>
                    <td className="table-cell"><CheckboxField name={`traffic.closures.${ci}.night`} label="Night" /></td>
                    <td className="table-cell"><NumberField name={`traffic.closures.${ci}.capacityVehPerHour`} label={`${name} capacity override`} hideLabel optional /></td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </section>
      )}

      {traffic && <ClosureHoursAdvisor />}

      <section className="card" aria-labelledby="costs-heading">
        <div className="flex flex-wrap items-center justify-between gap-2">
          <h2 id="costs-heading">Costs</h2>
          {!readOnly &&
            (costs ? (
              <button type="button" className="btn-danger" data-testid="costs-remove" onClick={() => set("costs", undefined)}>
                Remove costs
              </button>
            ) : (
              <button type="button" className="btn-secondary" data-testid="costs-add" onClick={() => set("costs", structuredClone(STARTER_COSTS))}>
                Add costs
              </button>
            ))}
        </div>
        {!costs ? (
          <p className="mt-2 text-sm text-muted">No contract costs. With a traffic profile, road-user cost still uses the default value of time (2015 dollars).</p>
        ) : (
          <div className="mt-3 grid gap-4 sm:grid-cols-3">
            <NumberField name="costs.valueOfTime.year" label="Dollar year of the values" step="1" />
            <NumberField name="costs.valueOfTime.carPerVehHour" label="Value of time, car ($/veh-h)" hint="Default from memory (USDOT guidance, 2015 $)." />
            <NumberField name="costs.valueOfTime.truckPerVehHour" label="Value of time, truck ($/veh-h)" />
            <NumberField name="costs.fieldCostPerDay" label="Field cost per working day ($)" />
            <NumberField name="costs.mobilizationPerSeason" label="Mobilization per season ($)" />
            <NumberField name="costs.winterProtectionPerWinter" label="Winter protection per winter ($)" />
            <NumberField name="costs.incentivePerDay" label="Incentive per day early ($)" hint="Against the target date." />
            <NumberField name="costs.disincentivePerDay" label="Disincentive per day late ($)" />
          </div>
        )}
      </section>
    </div>
  );
}

function DirectionDemand({ index, name }: { index: number; name: string }) {
  const { control } = useFormContext<ScenarioInput>();
  const demand = useWatch({ control, name: n(`traffic.directions.${index}.demand`) }) as Record<string, number[] | undefined> | undefined;
  const data = HOURS.map((h, i) => {
    const row: Record<string, string | number | null> = { hour: h.slice(0, 2) };
    for (const k of KINDS) {
      const v = demand?.[k.key]?.[i];
      row[k.key] = Number.isFinite(v) ? (v as number) : null;
    }
    return row;
  });
  const colors = ["var(--color-s5)", "var(--color-s6)", "var(--color-s3)", "var(--color-s7)", "var(--color-s8)"];
  const dashes = ["", "8 4", "2 3", "10 3 2 3", "5 5"];
  const base = `traffic.directions.${index}`;
  return (
    <>
      <section className="card" aria-labelledby={`dir-${index}-heading`}>
        <h2 id={`dir-${index}-heading`}>Demand: {name}</h2>
        <div className="mt-3 grid gap-4 sm:grid-cols-3">
          <TextField name={`${base}.name`} label="Direction name" />
          <NumberField name={`${base}.heavyVehicleShare`} label="Heavy-vehicle share (0–1)" step="0.01" min={0} max={1} />
        </div>
        <figure className="mt-3" aria-label={`Chart of hourly demand (veh/h) of ${name} for each day kind; the same values are in the table below`} data-testid={`traffic-demand-chart-${index}`}>
          <div className="h-72" aria-hidden="true">
            <ResponsiveContainer width="100%" height="100%" initialDimension={{ width: 700, height: 288 }}>
              <LineChart data={data} margin={{ top: 8, right: 16, bottom: 24, left: 8 }} accessibilityLayer={false}>
                <CartesianGrid stroke={GRID_STROKE} strokeDasharray="3 3" />
                <XAxis dataKey="hour" tick={AXIS_TICK} label={{ value: "Hour of day", position: "insideBottom", offset: -14, fill: "var(--color-ink)", fontSize: 12 }} />
                <YAxis width={64} tick={AXIS_TICK} label={{ value: "veh/h", angle: -90, position: "insideLeft", fill: "var(--color-ink)", fontSize: 12 }} />
                <Tooltip />
                {KINDS.map((k, i) => (
                  <Line key={k.key} dataKey={k.key} name={k.label} stroke={colors[i]} strokeDasharray={dashes[i]} strokeWidth={2} dot={false} isAnimationActive={false} />
                ))}
              </LineChart>
            </ResponsiveContainer>
          </div>
          {/* Legend in ink with line samples, as on the results charts (the library's wrote each name in its line's colour). */}
          <figcaption className="mt-2">
            <ChartLegend items={KINDS.map((k, i) => ({ label: k.label, line: { stroke: colors[i], strokeDasharray: dashes[i] } }))} />
          </figcaption>
        </figure>
      </section>
      <section className="card scroll-x p-0" aria-labelledby={`dir-${index}-table-heading`}>
        <h2 id={`dir-${index}-table-heading`} className="px-5 py-4">
          Hourly volumes, {name} (veh/h)
        </h2>
        <table className="w-full min-w-[720px] border-collapse" data-testid={`traffic-demand-table-${index}`}>
          <thead>
            <tr>
              <th scope="col" className="table-head">Hour</th>
              {KINDS.map((k) => (
                <th key={k.key} scope="col" className="table-head">{k.label}</th>
              ))}
            </tr>
          </thead>
          <tbody>
            {HOURS.map((h, i) => (
              <tr key={h} className="align-top">
                <th scope="row" className="table-cell text-left font-medium">{h}</th>
                {KINDS.map((k) => (
                  <td key={k.key} className="table-cell">
                    <NumberField name={`${base}.demand.${k.key}.${i}`} label={`${k.label} ${h} veh/h`} hideLabel step="10" min={0} />
                  </td>
                ))}
              </tr>
            ))}
          </tbody>
        </table>
      </section>
    </>
  );
}
