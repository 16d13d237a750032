/**
 * What one iteration costs (MODEL.md, "Traffic" and "Costs"). Contract: `impactModel(compiled)` compiles the
 * traffic model and the cost inputs once per compiled scenario (cached; null when the scenario has neither a
 * traffic section with a direction nor a costs section); `iterationImpact` turns one `simulate` result into
 * vehicle-hours of delay (D/D/1 over the closure timeline, ./traffic-capacity and ./traffic), road-user cost and contract cost.
 * It must be called right after the `simulate` whose result it reads (the closure timeline is scratch).
 * Units: veh-h, $ (in the dollars of `costs.valueOfTime.year`).
 */
import { seasonAt } from "./calendar";
import { parseIsoDate } from "./dates";
import type { CompiledScenario, SimResult } from "./engine";
import type { Costs } from "./schema";
import { compileTraffic, newQueueDetail, queueDelay, type QueueDetail, type TrafficModel } from "./traffic";
import { timelineCapacityPieces } from "./traffic-capacity";

/**
 * Value of time defaults, $ per vehicle-hour in 2015 dollars — from memory: USDOT departmental guidance on
 * the value of travel time (2016 revision): all-purpose local travel $14.10 per person-hour × 1.5 occupants
 * for a car; truck drivers $27.20 per hour. SOURCES.md ("Road-user cost", FHWA-HOP-12-005) gives the
 * method; the user should override with current values.
 */
export const DEFAULT_VALUE_OF_TIME = { year: 2015, carPerVehHour: 21.15, truckPerVehHour: 27.2 } as const;

export interface ImpactModel {
  traffic: TrafficModel | null;
  costs: Costs | null;
  carVot: number;
  truckVot: number;
  votYear: number;
  /** Day index of the target date, or null. */
  targetDay: number | null;
}

export interface IterationImpact {
  /** veh-h over all directions (0 without a traffic model). */
  delayVehHours: number;
  /** $, NaN without a traffic model. */
  roadUserCost: number;
  /** $, NaN without a costs section, Infinity when the iteration is unfinished. */
  contractCost: number;
  workingDays: number;
}

const cache = new WeakMap<CompiledScenario, ImpactModel | null>();

export function impactModel(c: CompiledScenario): ImpactModel | null {
  if (cache.has(c)) return cache.get(c)!;
  const s = c.scenario;
  const traffic = compileTraffic(s, c.calendar.startDay, c.calendar.days);
  const costs = s.costs ?? null;
  const vot = costs?.valueOfTime ?? DEFAULT_VALUE_OF_TIME;
  const m: ImpactModel | null =
    traffic || costs
      ? {
          traffic,
          costs,
          carVot: vot.carPerVehHour,
          truckVot: vot.truckPerVehHour,
          votYear: vot.year,
          targetDay: s.targetDate ? parseIsoDate(s.targetDate) - c.calendar.startDay : null,
        }
      : null;
  cache.set(c, m);
  return m;
}

/**
 * Road-user (delay) cost, $: delay × value of time, split by the direction's heavy-vehicle share.
 * Source: FHWA-HOP-12-005 (Mallela & Sadasivam 2011), delay cost = vehicle-hours × value of time by class.
 */
export function roadUserCost(delayVehHours: number, heavyShare: number, carVot: number, truckVot: number): number {
  return delayVehHours * ((1 - heavyShare) * carVot + heavyShare * truckVot);
}

/**
 * Contract cost, $: daily field cost × working days + mobilization × seasons worked + winter protection ×
 * winters crossed + incentive × days early − disincentive × days late (calendar days against the target
 * date). Common practice of cost estimating, no published source. Infinity when unfinished.
 */
export function contractCost(p: { costs: Costs; workingDays: number; seasons: number; finishDay: number; targetDay: number | null }): number {
  if (!(p.finishDay < Infinity)) return Infinity;
  const k = p.costs;
  let total = k.fieldCostPerDay * p.workingDays + k.mobilizationPerSeason * p.seasons + k.winterProtectionPerWinter * Math.max(0, p.seasons - 1);
  if (p.targetDay !== null) {
    if (p.finishDay < p.targetDay) total += k.incentivePerDay * (p.targetDay - p.finishDay);
    else if (p.finishDay > p.targetDay) total -= k.disincentivePerDay * (p.finishDay - p.targetDay);
  }
  return total;
}

/** Per-direction queue detail of the representative iteration (when `detail` is asked for). */
export interface ImpactDetail {
  perDirection: QueueDetail[];
}

export function iterationImpact(c: CompiledScenario, m: ImpactModel, r: SimResult, detail?: ImpactDetail): IterationImpact {
  let delay = 0;
  let ruc = NaN;
  if (m.traffic) {
    ruc = 0;
    const t = m.traffic;
    for (let i = 0; i < t.directions.length; i++) {
      const dir = t.directions[i];
      let d: QueueDetail | null = null;
      if (detail) {
        d = newQueueDetail(t.days);
        detail.perDirection[i] = d;
      }
      const v = queueDelay(t, dir, timelineCapacityPieces(t, dir, c.timeline), d);
      delay += v;
      ruc += roadUserCost(v, dir.heavyShare, m.carVot, m.truckVot);
    }
  }
  let contract = NaN;
  let workingDays = 0;
  if (m.costs) {
    const w = c.work.shiftDaysWorked();
    workingDays = w.days;
    const seasons = w.days === 0 ? 0 : seasonAt(c.calendar, 24 * w.last) - seasonAt(c.calendar, 24 * w.first) + 1;
    const finishDay = r.unfinished ? Infinity : Math.floor(r.finish / 24);
    contract = contractCost({ costs: m.costs, workingDays: w.days, seasons, finishDay, targetDay: m.targetDay });
  }
  return { delayVehHours: delay, roadUserCost: ruc, contractCost: contract, workingDays };
}
