"use client";
/**
 * Choosing what a plan search varies. Each choice becomes one dimension of levels (sim/search); the form
 * shows how many combinations that makes and whether all will run or a sample of them.
 */
import { useMemo, useState } from "react";
import { useRouter } from "next/navigation";
import { useMutation } from "@tanstack/react-query";
import { api, ApiError } from "@/lib/api-client";
import type { SearchStartedAnswer } from "@/lib/search-contract";
import { gridSize, intRange, MAX_SEARCH_VARIANTS, type SearchDimension, type SearchSpec } from "@sim/search";
import { formatDayNumber, parseIsoDate } from "@sim/dates";
import { formatIsoDate } from "@/lib/format";

interface PlanShape {
  startDate: string;
  operations: { id: string; name: string; kind: string; crews?: number; shifts?: string[] }[];
  calendar: { shifts: { id: string; name: string }[]; closureWindows: unknown[]; holidays: { policy: string }; season: { plan: string; cutoffDate?: string; cutoffStationFt?: number } };
  deck: { startStationFt: number; lengthFt: number };
}

/** The scenario's field log, when it has shifts: how many, and the last day they reach. */
type FieldLogShape = { shifts: number; lastWorkDate: string } | null;

export function SearchForm({ scenarioId, plan, fieldLog }: { scenarioId: string; plan: PlanShape; fieldLog: FieldLogShape }) {
  const router = useRouter();
  const crewOps = plan.operations.filter((o) => o.kind === "crew");
  const [name, setName] = useState("Plan search");
  const [crews, setCrews] = useState<Record<string, { on: boolean; from: number; to: number }>>(() => Object.fromEntries(crewOps.map((o) => [o.id, { on: false, from: 1, to: Math.max(2, (o.crews ?? 1) + 1) }])));
  const [shiftOps, setShiftOps] = useState<Record<string, boolean>>({});
  const [holidays, setHolidays] = useState(true);
  const [windows, setWindows] = useState(false);
  const [season, setSeason] = useState(false);
  const [cutoffDate, setCutoffDate] = useState(plan.calendar.season.cutoffDate ?? "");
  const [cutoffStation, setCutoffStation] = useState(plan.calendar.season.cutoffStationFt ?? Math.round(plan.deck.startStationFt + plan.deck.lengthFt / 2));
  const [start, setStart] = useState({ on: false, from: plan.startDate, to: formatDayNumber(parseIsoDate(plan.startDate) + 28), stepDays: 14 });
  const [iterations, setIterations] = useState(1000);
  const [maxVariants, setMaxVariants] = useState(60);
  const [seed, setSeed] = useState("search");
  const [fromLog, setFromLog] = useState(fieldLog !== null);
  const [dataDate, setDataDate] = useState(fieldLog?.lastWorkDate ?? "");

  const dimensions = useMemo(() => {
    const dims: SearchDimension[] = [];
    for (const o of crewOps) if (crews[o.id]?.on) dims.push({ kind: "crews", operation: o.id, values: intRange(crews[o.id].from, crews[o.id].to) });
    const allShifts = plan.calendar.shifts.map((s) => s.id);
    for (const o of crewOps) if (shiftOps[o.id]) dims.push({ kind: "shifts", operation: o.id, values: [...allShifts.map((s) => [s]), allShifts] });
    const n = plan.calendar.closureWindows.length;
    if (windows && n > 1) dims.push({ kind: "closureWindows", values: [intRange(0, n - 1), ...intRange(0, n - 1).map((w) => intRange(0, n - 1).filter((x) => x !== w))] });
    if (season && cutoffDate) dims.push({ kind: "season", values: [{ plan: "single" }, { plan: "two", cutoffDate, cutoffStationFt: cutoffStation }] });
    if (holidays) dims.push({ kind: "holidayPolicy", values: ["standDown", "workThrough"] });
    // Once the work has started (a search from the field log) its start date is history, not a choice.
    if (start.on && !fromLog) {
      const a = parseIsoDate(start.from);
      const b = parseIsoDate(start.to);
      dims.push({ kind: "startDate", values: intRange(a, Math.max(a, b), Math.max(1, start.stepDays)).map(formatDayNumber) });
    }
    return dims.filter((d) => d.values.length > 0);
  }, [crewOps, crews, shiftOps, windows, season, cutoffDate, cutoffStation, holidays, start, fromLog, plan]);
  const size = dimensions.length ? gridSize(dimensions) : 0;

  const create = useMutation({
    mutationFn: (spec: SearchSpec) => api<SearchStartedAnswer>(`/api/scenarios/${scenarioId}/searches`, { method: "POST", body: { name, spec } }),
    onSuccess: (r) => router.push(`/scenarios/${scenarioId}/search/${r.search.id}`),
  });
  const problem = create.error instanceof ApiError && create.error.fields.length ? create.error.fields.map((f) => `${f.label ?? f.path}: ${f.message}`).join("; ") : create.error?.message;

  return (
    <form
      className="card space-y-4"
      onSubmit={(e) => {
        e.preventDefault();
        create.mutate({ dimensions, maxVariants, iterations, seed, ...(fromLog ? { fromFieldLog: { dataDate } } : {}) });
      }}
    >
      <h2>New plan search</h2>
      <div>
        <label htmlFor="search-name" className="field-label">Name</label>
        <input id="search-name" className="field-input w-80" value={name} maxLength={120} onChange={(e) => setName(e.target.value)} />
      </div>
      <fieldset className="space-y-2 text-sm" data-testid="search-from">
        <legend className="field-label">Where each plan starts</legend>
        <label className="flex items-center gap-2">
          <input type="radio" name="search-from" checked={!fromLog} onChange={() => setFromLog(false)} /> From the plan&apos;s start ({formatIsoDate(plan.startDate)}): the whole job
        </label>
        <div className="flex flex-wrap items-center gap-2">
          <label className="flex items-center gap-2">
            <input type="radio" name="search-from" checked={fromLog} onChange={() => setFromLog(true)} /> From the field log as of
          </label>
          <input type="date" className="field-input mt-0 inline-block w-44" value={dataDate} onChange={(e) => setDataDate(e.target.value)} aria-label="Data date" disabled={!fromLog} />
        </div>
        <p className="text-xs text-muted">
          {fieldLog
            ? `The rest of the job: every plan starts from the work the field log records up to that day (${fieldLog.shifts.toLocaleString("en-US")} shift${fieldLog.shifts === 1 ? "" : "s"} in it now, the last on ${formatIsoDate(fieldLog.lastWorkDate)}), as a re-forecast does, on the climate profile without the weather forecast.`
            : "The rest of the job: every plan starts from the work the field log records up to that day, as a re-forecast does (nothing is recorded yet)."}
        </p>
      </fieldset>
      <fieldset className="space-y-2">
        <legend className="field-label">Crews per operation</legend>
        {crewOps.map((o) => (
          <div key={o.id} className="flex flex-wrap items-center gap-2 text-sm">
            <label className="flex w-64 items-center gap-2">
              <input type="checkbox" checked={crews[o.id]?.on ?? false} onChange={(e) => setCrews({ ...crews, [o.id]: { ...crews[o.id], on: e.target.checked } })} /> {o.name}
            </label>
            <label>from <input type="number" min={1} max={10} className="field-input mt-0 ml-1 inline-block w-16" value={crews[o.id]?.from ?? 1} onChange={(e) => setCrews({ ...crews, [o.id]: { ...crews[o.id], from: Number(e.target.value) } })} aria-label={`${o.name}: fewest crews`} /></label>
            <label>to <input type="number" min={1} max={10} className="field-input mt-0 ml-1 inline-block w-16" value={crews[o.id]?.to ?? 2} onChange={(e) => setCrews({ ...crews, [o.id]: { ...crews[o.id], to: Number(e.target.value) } })} aria-label={`${o.name}: most crews`} /></label>
            {plan.calendar.shifts.length > 1 && (
              <label className="ml-4 flex items-center gap-2">
                <input type="checkbox" checked={shiftOps[o.id] ?? false} onChange={(e) => setShiftOps({ ...shiftOps, [o.id]: e.target.checked })} /> try each shift alone and all together
              </label>
            )}
          </div>
        ))}
      </fieldset>
      <fieldset className="space-y-2 text-sm">
        <legend className="field-label">Calendar</legend>
        <label className="flex items-center gap-2"><input type="checkbox" checked={holidays} onChange={(e) => setHolidays(e.target.checked)} /> Holidays: both standing down and working through</label>
        {plan.calendar.closureWindows.length > 1 && (
          <label className="flex items-center gap-2"><input type="checkbox" checked={windows} onChange={(e) => setWindows(e.target.checked)} /> Closure windows: all of them, and each one left out in turn</label>
        )}
        <div className="flex flex-wrap items-center gap-2">
          <label className="flex items-center gap-2"><input type="checkbox" checked={season} onChange={(e) => setSeason(e.target.checked)} /> Seasons: one, and two with the first ending on</label>
          <input type="date" className="field-input mt-0 inline-block w-44" value={cutoffDate} onChange={(e) => setCutoffDate(e.target.value)} aria-label="Cut-off date" />
          <label>at station (ft) <input type="number" className="field-input mt-0 ml-1 inline-block w-28" value={cutoffStation} onChange={(e) => setCutoffStation(Number(e.target.value))} /></label>
        </div>
        <div className="flex flex-wrap items-center gap-2">
          <label className="flex items-center gap-2"><input type="checkbox" checked={start.on && !fromLog} disabled={fromLog} onChange={(e) => setStart({ ...start, on: e.target.checked })} /> Start dates{fromLog ? " (not from the field log: the work has started)" : ""}: between</label>
          <input type="date" className="field-input mt-0 inline-block w-44" value={start.from} onChange={(e) => setStart({ ...start, from: e.target.value })} aria-label="Earliest start" />
          and <input type="date" className="field-input mt-0 inline-block w-44" value={start.to} onChange={(e) => setStart({ ...start, to: e.target.value })} aria-label="Latest start" />
          <label>every <input type="number" min={1} max={90} className="field-input mt-0 mx-1 inline-block w-16" value={start.stepDays} onChange={(e) => setStart({ ...start, stepDays: Number(e.target.value) })} /> days</label>
        </div>
      </fieldset>
      <div className="flex flex-wrap items-end gap-4">
        <div><label htmlFor="search-iterations" className="field-label">Iterations per plan</label>
          <select id="search-iterations" className="field-input w-32" value={iterations} onChange={(e) => setIterations(Number(e.target.value))}>
            {[200, 500, 1000, 2000].map((n) => <option key={n} value={n}>{n.toLocaleString("en-US")}</option>)}
          </select></div>
        <div><label htmlFor="search-max" className="field-label">At most plans</label>
          <input id="search-max" type="number" min={2} max={MAX_SEARCH_VARIANTS} className="field-input w-24" value={maxVariants} onChange={(e) => setMaxVariants(Number(e.target.value))} /></div>
        <div><label htmlFor="search-seed" className="field-label">Seed</label>
          <input id="search-seed" className="field-input w-32" value={seed} maxLength={60} onChange={(e) => setSeed(e.target.value)} /></div>
        <button type="submit" className="btn-primary" disabled={create.isPending || dimensions.length === 0} data-testid="start-search">Search</button>
      </div>
      <p className="text-sm text-muted" aria-live="polite">
        {dimensions.length === 0 ? "Choose at least one thing to vary." : size <= maxVariants ? `${size} combinations: every one will run.` : `${size.toLocaleString("en-US")} combinations: a space-filling sample of about ${maxVariants} will run.`}
      </p>
      {create.isError && <p role="alert" className="text-sm text-bad">The search could not start: {problem}</p>}
    </form>
  );
}
