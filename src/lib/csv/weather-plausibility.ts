/**
 * Is a converted weather history one that a place on Earth could have had? Monthly means far outside what any
 * climate shows usually mean a unit mix-up (Celsius read as Fahrenheit: a July maximum of 30 °F). Checked
 * before anything is fitted or applied; each problem says what looks wrong and which unit was probably meant.
 * Bounds are broad on purpose (common practice, no published source): record monthly means on land lie well
 * inside them.
 */
import type { DailyObservation } from "@sim/weather-fit";
import type { RowProblem } from "./common";
import type { PrecipitationUnit, TemperatureUnit, WindUnit } from "./weather-columns";
import { monthName } from "@/lib/format";

const MONTHS = Array.from({ length: 12 }, (_, i) => monthName(i + 1, true));
const fToC = (f: number) => ((f - 32) * 5) / 9;
const round = (x: number) => Math.round(x);

export function checkPlausible(obs: DailyObservation[], units: { temperature: TemperatureUnit; precipitation: PrecipitationUnit; wind: WindUnit }): RowProblem[] {
  const problems: RowProblem[] = [];
  const byMonth = Array.from({ length: 12 }, () => ({ tmax: [] as number[], wetPrecip: [] as number[], wind: [] as number[] }));
  for (const o of obs) {
    const m = byMonth[Number(o.date.slice(5, 7)) - 1];
    m.tmax.push(o.tmaxF);
    if (o.precipIn > 0) m.wetPrecip.push(o.precipIn);
    if (o.windMph !== undefined) m.wind.push(o.windMph);
  }
  const mean = (a: number[]) => a.reduce((x, y) => x + y, 0) / a.length;
  const months = byMonth.map((m, i) => ({ name: MONTHS[i], ...m })).filter((m) => m.tmax.length > 0);
  const warmest = months.reduce((a, b) => (mean(b.tmax) > mean(a.tmax) ? b : a));
  const hot = mean(warmest.tmax);
  const pick = units.temperature === "F" ? "°F" : "°C";
  // The warmest month of any inhabited climate averages a maximum above 40 °F and below about 118 °F.
  if (hot < 40 && units.temperature === "F") {
    problems.push({
      row: 1,
      field: "temperature unit",
      message: `${warmest.name}'s maximum temperatures average ${round(hot)} °F, colder than any climate where a deck is built. Did you mean °C? (${round(hot)} °C would be ${round((round(hot) * 9) / 5 + 32)} °F.) Choose °C and upload again.`,
    });
  } else if (hot > 118) {
    problems.push({
      row: 1,
      field: "temperature unit",
      message: `${warmest.name}'s maximum temperatures average ${round(hot)} °F (${round(fToC(hot))} °C), hotter than any climate on record.${units.temperature === "C" ? " Did you mean °F? Choose °F and upload again." : ` Check the ${pick} column.`}`,
    });
  }
  const wet = months.flatMap((m) => m.wetPrecip);
  if (wet.length >= 10) {
    const perWetDay = mean(wet);
    // A wet day's mean precipitation lies between about 0.05 and 2 inches almost everywhere.
    if (perWetDay > 3 && units.precipitation === "in") {
      problems.push({ row: 1, field: "precipitation unit", message: `A wet day brings ${perWetDay.toFixed(1)} inches on average, far more than any climate. Did you mean millimetres? Choose mm and upload again.` });
    } else if (perWetDay < 0.01 && units.precipitation === "mm") {
      problems.push({ row: 1, field: "precipitation unit", message: `A wet day brings ${(perWetDay * 25.4).toFixed(2)} mm on average, less than a drizzle. Did you mean inches? Choose inches and upload again.` });
    }
  }
  const windy = months.filter((m) => m.wind.length > 0);
  if (windy.length) {
    const top = windy.reduce((a, b) => (mean(b.wind) > mean(a.wind) ? b : a));
    // A month's mean wind above about 45 mph is unknown outside mountain summits and the poles.
    if (mean(top.wind) > 45) {
      const alt = units.wind === "ms" ? "mph or km/h" : units.wind === "mph" ? "km/h" : "a smaller unit";
      problems.push({ row: 1, field: "wind unit", message: `${top.name}'s wind averages ${round(mean(top.wind))} mph, stronger than any month of any lowland climate. Did you mean ${alt}? Choose the unit and upload again.` });
    }
  }
  return problems;
}
