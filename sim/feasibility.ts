/**
 * Plans that can never finish because of the weather, told in words before a run: a temperature gate that no
 * month outside winter reaches, or rain every day where an operation needs none. The engine would simply run
 * to its horizon and report every iteration unfinished; this says why before anyone waits for that.
 * A month "reaches" a minimum temperature when its mean daily maximum plus three standard deviations does
 * (a day above that is rarer than about 1 in 700 — a judgement, no published source). Necessary conditions
 * only: a plan that passes may still finish late.
 */
import type { FieldProblem, Scenario } from "./schema";

const MONTHS = ["January", "February", "March", "April", "May", "June", "July", "August", "September", "October", "November", "December"];
const DAYS = [31, 28, 31, 30, 31, 30, 31, 31, 30, 31, 30, 31];

/** Months with at least one day outside winter (winter runs from winterStart into the next year to winterEnd). */
export function workMonths(s: Scenario): number[] {
  const { winterStart, winterEnd } = s.calendar.season;
  const md = (m: number, d: number) => `${String(m + 1).padStart(2, "0")}-${String(d).padStart(2, "0")}`;
  const inWinter = (x: string) => x >= winterStart || x <= winterEnd;
  const out: number[] = [];
  for (let m = 0; m < 12; m++) {
    for (let d = 1; d <= DAYS[m]; d++) {
      if (!inWinter(md(m, d))) {
        out.push(m);
        break;
      }
    }
  }
  return out;
}

export function weatherFeasibility(s: Scenario): FieldProblem[] {
  const out: FieldProblem[] = [];
  const months = workMonths(s);
  if (months.length === 0) return out; // an all-winter calendar is refused by validate
  const monthly = s.weather.monthly;
  const warmest = months.reduce((a, b) => (monthly[b].tmaxMeanF > monthly[a].tmaxMeanF ? b : a));
  s.operations.forEach((op, i) => {
    if (op.kind !== "crew") return;
    const g = op.gates;
    if (g.minTempF !== undefined) {
      const reach = months.some((m) => monthly[m].tmaxMeanF + 3 * monthly[m].tmaxSdF >= g.minTempF!);
      if (!reach) {
        const w = monthly[warmest];
        out.push({
          path: `operations[${i}].gates.minTempF`,
          message:
            `${op.name} needs ${g.minTempF} °F${g.rising ? " and rising" : ""}; no month of this climate outside winter reaches it ` +
            `(the warmest, ${MONTHS[warmest]}, averages a maximum of ${Math.round(w.tmaxMeanF)} °F). The plan can never finish: check the temperatures ` +
            `in the Weather section (were they entered in °C?) or the limit in Crews and rates.`,
        });
      }
    }
    if (g.noRain && months.every((m) => monthly[m].pWetAfterDry >= 1 && monthly[m].pWetAfterWet >= 1)) {
      out.push({
        path: `operations[${i}].gates.noRain`,
        message: `${op.name} needs a dry spell, but in this climate it rains every day of every month outside winter. The plan can never finish: check the wet-day chances in the Weather section.`,
      });
    }
  });
  return out;
}
