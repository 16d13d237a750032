/** Turning a checked upload into a new plan definition (the user then saves it like any other edit). */
import type { ClimateFit } from "@sim/weather-fit";
import type { SurveyRange } from "./survey-csv";

type Definition = Record<string, any>;
const round = (x: number, d: number) => Math.round(x * 10 ** d) / 10 ** d;

/** Months the history does not cover keep their current values; humidity is not in a history, so it is kept. */
export function applyClimateFit(definition: Definition, fit: ClimateFit): Definition {
  const monthly = (definition.weather.monthly as Definition[]).map((cur, i) => {
    const f = fit.monthly[i];
    if (!f) return cur;
    return {
      ...cur,
      tmaxMeanF: round(f.tmaxMeanF, 1),
      tmaxSdF: round(f.tmaxSdF, 1),
      tminMeanF: round(f.tminMeanF, 1),
      tminSdF: round(f.tminSdF, 1),
      pWetAfterDry: round(f.pWetAfterDry, 3),
      pWetAfterWet: round(f.pWetAfterWet, 3),
      windMeanMph: f.windMeanMph == null ? cur.windMeanMph : round(f.windMeanMph, 1),
    };
  });
  return {
    ...definition,
    weather: {
      ...definition.weather,
      monthly,
      ...(fit.wetTmaxShiftF != null ? { wetTmaxShiftF: round(Math.max(-30, Math.min(10, fit.wetTmaxShiftF)), 1) } : {}),
      ...(fit.wetTminShiftF != null ? { wetTminShiftF: round(Math.max(-30, Math.min(30, fit.wetTminShiftF)), 1) } : {}),
      ...(fit.serialCorrelation != null ? { serialCorrelation: round(fit.serialCorrelation, 2) } : {}),
    },
  };
}

export function applySurvey(definition: Definition, ranges: SurveyRange[]): Definition {
  return { ...definition, deck: { ...definition.deck, survey: ranges.map((r) => ({ ...r })) } };
}
