/**
 * A compact, read-only account of a scenario's inputs for the shared page: operations (rates, crews, shifts,
 * closures, gates), the calendar (shifts, work days, closure windows), the season plan and holiday policy.
 * Works from the parsed definition so defaults read as they run.
 */
import { parseScenario } from "@sim/validate";
import type { Distribution, Scenario } from "@sim/schema";
import { stageSentence } from "@/lib/stage-text";
import { formatIsoDate, formatStation, monthName } from "@/lib/format";
import { ScrollBox } from "@/components/scroll-box";

const DAYS = ["Sun", "Mon", "Tue", "Wed", "Thu", "Fri", "Sat"];
const n = (v: number) => v.toLocaleString("en-US", { maximumFractionDigits: 2 });

function dist(d: Distribution, unit: string): string {
  switch (d.type) {
    case "fixed":
      return `${n(d.value)} ${unit}`;
    case "triangular":
      return `${n(d.min)}–${n(d.max)} ${unit} (most likely ${n(d.mode)}, triangular)`;
    case "pert":
      return `${n(d.min)}–${n(d.max)} ${unit} (most likely ${n(d.mode)}, PERT)`;
    case "lognormal":
      return `median ${n(d.median)} ${unit} (lognormal, σ ${n(d.sigma)})`;
  }
}

const MONTHS = Array.from({ length: 12 }, (_, i) => monthName(i + 1));
/** "11-15" → "15 Nov". */
const monthDay = (md: string) => `${Number(md.slice(3, 5))} ${MONTHS[Number(md.slice(0, 2)) - 1] ?? md}`;

function clock(h: number): string {
  const hh = Math.floor(h) % 24;
  const mm = Math.round((h - Math.floor(h)) * 60);
  return `${String(hh).padStart(2, "0")}:${String(mm).padStart(2, "0")}`;
}

function gatesText(g: Scenario["operations"][number] & { kind: "crew" }): string {
  const parts: string[] = [];
  const x = g.gates;
  if (x.minTempF !== undefined) parts.push(`≥ ${x.minTempF} °F${x.rising ? " and rising" : ""}`);
  else if (x.rising) parts.push("rising temperature");
  if (x.noRain) parts.push("no rain");
  if (x.noRainHoursAfter) parts.push(`dry ${x.noRainHoursAfter} h after`);
  if (x.maxWindMph !== undefined) parts.push(`wind ≤ ${x.maxWindMph} mph`);
  if (x.maxEvaporation !== undefined) parts.push(`evaporation ≤ ${x.maxEvaporation} lb/ft²/h`);
  if (x.maxTempF !== undefined) parts.push(`≤ ${x.maxTempF} °F`);
  if (x.protectAfter?.minTempF !== undefined && x.protectAfter.hours) parts.push(`air ≥ ${x.protectAfter.minTempF} °F for ${x.protectAfter.hours} h after`);
  return parts.length ? parts.join(", ") : "none";
}

export function InputsSummary({ definition }: { definition: unknown }) {
  const parsed = parseScenario(definition);
  if (!parsed.ok) return <p className="text-sm text-muted">The inputs of this scenario could not be read.</p>;
  const s = parsed.scenario;
  const cal = s.calendar;
  const shiftName = new Map(cal.shifts.map((x) => [x.id, x.name]));
  const closureName = new Map(cal.closures.map((x) => [x.id, x.name]));
  const season = cal.season;
  return (
    <div className="space-y-5 text-sm">
      <dl className="grid gap-x-6 gap-y-1 sm:grid-cols-2">
        <div>
          <dt className="inline font-medium">Deck: </dt>
          <dd className="inline">
            {n(s.deck.lengthFt)} ft from {formatStation(s.deck.startStationFt)}, worked in {n(s.deck.packetFt)} ft packets; lanes {s.deck.lanes.join(", ")}
          </dd>
        </div>
        <div>
          <dt className="inline font-medium">Start / target: </dt>
          <dd className="inline">
            {formatIsoDate(s.startDate)} / {s.targetDate ? formatIsoDate(s.targetDate) : "no target"}
          </dd>
        </div>
        <div>
          <dt className="inline font-medium">Weather: </dt>
          <dd className="inline">{s.weather.mode === "stochastic" ? "simulated daily weather from monthly climate figures" : "fixed monthly averages (no rain)"}</dd>
        </div>
        <div>
          <dt className="inline font-medium">Discovered conditions: </dt>
          <dd className="inline">
            {s.discovered.defaultProbability > 0 || s.deck.survey.length
              ? `${Math.round(s.discovered.defaultProbability * 100)} % of packets by default${s.deck.survey.length ? `, ${s.deck.survey.length} surveyed ranges` : ""}; extra ${dist(s.discovered.extraHours, "h")}`
              : "not modelled"}
          </dd>
        </div>
      </dl>

      <ScrollBox label="Operations (scrolls sideways)">
        <table className="w-full min-w-[640px] border-collapse">
          <caption className="mb-1 text-left font-semibold">Operations</caption>
          <thead>
            <tr>
              <th scope="col" className="table-head">Operation</th>
              <th scope="col" className="table-head">Rate or duration</th>
              <th scope="col" className="table-head">Crews</th>
              <th scope="col" className="table-head">Shifts and closure</th>
              <th scope="col" className="table-head">Weather limits</th>
            </tr>
          </thead>
          <tbody>
            {s.operations.map((op) => (
              <tr key={op.id}>
                <th scope="row" className="table-cell text-left font-medium">
                  {op.name}
                  {op.kind === "crew" && op.continuous && <span className="block text-xs font-normal text-muted">continuous (never stopped part-way)</span>}
                </th>
                {op.kind === "crew" ? (
                  <>
                    <td className="table-cell">{dist(op.rate.dist, op.rate.unit === "ftPerHour" ? "ft/h" : "ft/shift")}</td>
                    <td className="table-cell">
                      {op.crews}
                      {op.mobilizationHours ? <span className="block text-xs text-muted">{n(op.mobilizationHours)} h to mobilize</span> : null}
                    </td>
                    <td className="table-cell">
                      {op.shifts.map((id) => shiftName.get(id) ?? id).join(", ")}
                      <span className="block text-xs text-muted">{op.closure ? (closureName.get(op.closure) ?? op.closure) : "stage's standing closure only"}</span>
                    </td>
                    <td className="table-cell">{gatesText(op)}</td>
                  </>
                ) : (
                  <>
                    <td className="table-cell">
                      {dist(op.durationHours, "h")} per packet{op.countAboveF !== undefined ? `, counting only hours at or above ${op.countAboveF} °F` : ""}
                    </td>
                    <td className="table-cell text-muted">no crew</td>
                    <td className="table-cell text-muted">any time</td>
                    <td className="table-cell text-muted">—</td>
                  </>
                )}
              </tr>
            ))}
          </tbody>
        </table>
      </ScrollBox>

      <div>
        <h3>Stages</h3>
        <ul className="mt-1 list-disc space-y-0.5 pl-5" data-testid="inputs-stages">
          {s.stages.map((_, i) => (
            <li key={i}>{stageSentence(s, i)}</li>
          ))}
        </ul>
      </div>

      <div className="grid gap-5 md:grid-cols-2">
        <div>
          <h3>Calendar</h3>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            <li>Work days: {cal.workDays.slice().sort().map((d) => DAYS[d]).join(", ")}</li>
            {cal.shifts.map((x) => (
              <li key={x.id}>
                {x.name}: {clock(x.startHour)} for {n(x.lengthHours)} h
              </li>
            ))}
          </ul>
          <h3 className="mt-3">Closure windows</h3>
          <ul className="mt-1 list-disc space-y-0.5 pl-5">
            {cal.closures.map((c) => {
              const windows = cal.closureWindows.filter((w) => w.closure === c.id);
              return (
                <li key={c.id}>
                  {c.name} (closes {c.lanesClosed.join(", ")}
                  {c.setupHours || c.takedownHours ? `; ${n(c.setupHours)} h set-up, ${n(c.takedownHours)} h take-down` : ""}):{" "}
                  {windows.length
                    ? windows.map((w) => `${w.dayTypes.join("/")} ${clock(w.startHour)}–${clock(w.endHour)}${w.endHour <= w.startHour ? " (overnight)" : ""}`).join("; ")
                    : "no windows"}
                </li>
              );
            })}
          </ul>
        </div>
        <div>
          <h3>Season plan</h3>
          <p className="mt-1">
            {season.plan === "two" ? "Two seasons" : "One season"}; winter stand-down {monthDay(season.winterStart)} to {monthDay(season.winterEnd)} each year
            {season.demobilizeHours ? `, ${n(season.demobilizeHours)} h to demobilize before it` : ""}
            {season.remobilizeHours ? `, ${n(season.remobilizeHours)} h to remobilize after it` : ""}.
            {season.plan === "two" && season.cutoffDate ? ` Season 1 ends on ${formatIsoDate(season.cutoffDate)}.` : ""}
            {season.plan === "two" && season.cutoffStationFt !== undefined ? ` Work from ${formatStation(season.cutoffStationFt)} on waits for season 2.` : ""}
          </p>
          <h3 className="mt-3">Holidays</h3>
          <p className="mt-1">
            {cal.holidays.policy === "standDown"
              ? `Crews stand down over holidays (from ${clock(cal.holidays.standDownStartHour)} the day before, with adjoining weekends${cal.holidays.standDownThroughMonday ? " and the Monday after" : ""})`
              : "Crews work through holidays"}
            {cal.holidays.observeFederal ? "; federal holidays observed" : "; federal holidays not observed"}
            {cal.holidays.blackoutDates.length ? `; ${cal.holidays.blackoutDates.length} blackout dates` : ""}.
          </p>
        </div>
      </div>
    </div>
  );
}
