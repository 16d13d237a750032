/**
 * Plan search: what a person chooses to vary, and the variants built from it. Every dimension lists its
 * levels; the variants are every combination when the grid is small, otherwise a Latin-hypercube sample
 * (each dimension's levels spread evenly over the sample) of a stated count. A variant is a list of level
 * indices, applied to the stored scenario definition by `applyVariant`; whether the result is a valid plan
 * is for `parseScenario` to say (a variant may, say, leave an operation without a closure window).
 * Pure: the sample's randomness is the seeded stream of ./random.
 */
import { z } from "zod";
import { createRng } from "./random";
import type { ScenarioInput } from "./schema";

const isoDate = z.string().regex(/^\d{4}-\d{2}-\d{2}$/, "must be a date YYYY-MM-DD");
const id = z.string().min(1).max(60);
const levels = <T extends z.ZodType>(t: T) => z.array(t).min(1, "must list at least one value").max(50, "may list at most 50 values");

export const seasonChoiceSchema = z.discriminatedUnion("plan", [
  z.object({ plan: z.literal("single") }),
  z.object({ plan: z.literal("two"), cutoffDate: isoDate, cutoffStationFt: z.number().min(0) }),
]);
export type SeasonChoice = z.infer<typeof seasonChoiceSchema>;

export const searchDimensionSchema = z.discriminatedUnion("kind", [
  z.object({ kind: z.literal("crews"), operation: id, values: levels(z.number().int().min(1, "crews must be at least 1").max(10, "crews may be at most 10")) }),
  z.object({ kind: z.literal("shifts"), operation: id, values: levels(z.array(id).min(1, "a shift set must name a shift")) }),
  /** Each level is the set of `calendar.closureWindows` indices allowed. */
  z.object({ kind: z.literal("closureWindows"), values: levels(z.array(z.number().int().min(0)).min(1, "must allow at least one window")) }),
  z.object({ kind: z.literal("season"), values: levels(seasonChoiceSchema) }),
  z.object({ kind: z.literal("holidayPolicy"), values: levels(z.enum(["standDown", "workThrough"])) }),
  z.object({ kind: z.literal("startDate"), values: levels(isoDate) }),
]);
export type SearchDimension = z.infer<typeof searchDimensionSchema>;

export const MAX_SEARCH_VARIANTS = 200;

export const searchSpecSchema = z.object({
  dimensions: z.array(searchDimensionSchema).min(1, "choose at least one thing to vary").max(8, "may vary at most 8 things"),
  /** The most variants to run; a larger grid is sampled down to this count. */
  maxVariants: z.number().int().min(2, "must be at least 2").max(MAX_SEARCH_VARIANTS, `must be at most ${MAX_SEARCH_VARIANTS}`),
  iterations: z.number().int().min(100, "must be at least 100").max(5_000, "must be at most 5,000 per variant"),
  seed: z.string().trim().min(1, "must not be empty").max(60),
  /**
   * Search the rest of the job instead of the whole plan: every plan starts from the field log's as-built state at
   * this data date, as a re-forecast does (MODEL.md "Re-forecast"), on the climate profile alone. Absent: from the
   * plan's start.
   */
  fromFieldLog: z.object({ dataDate: isoDate }).strict().optional(),
});
export type SearchSpec = z.infer<typeof searchSpecSchema>;

export interface VariantPlan {
  method: "grid" | "sample";
  /** Combinations in the full grid. */
  gridSize: number;
  /** Each variant: one level index per dimension. */
  variants: number[][];
}

export function gridSize(dims: readonly { values: readonly unknown[] }[]): number {
  return dims.reduce((n, d) => n * d.values.length, 1);
}

/** Every combination, the last dimension changing fastest. */
export function fullGrid(sizes: readonly number[]): number[][] {
  let out: number[][] = [[]];
  for (const n of sizes) out = out.flatMap((prefix) => Array.from({ length: n }, (_, i) => [...prefix, i]));
  return out;
}

/**
 * A Latin-hypercube sample of `count` points over discrete levels: for each dimension the count is split
 * into equal strata, each stratum used once (in a shuffled order, independently per dimension), and a
 * stratum maps to the level it falls in, so every level is used about equally often. Duplicate combinations are dropped, so the result may be a little smaller than `count`.
 */
export function latinHypercube(sizes: readonly number[], count: number, seed: string): number[][] {
  const rng = createRng(`search:${seed}`);
  const columns = sizes.map((n) => {
    const strata = Array.from({ length: count }, (_, i) => i);
    for (let i = count - 1; i > 0; i--) {
      const j = Math.floor(rng.next() * (i + 1));
      [strata[i], strata[j]] = [strata[j], strata[i]];
    }
    // Stratum s maps to level ⌊s·n/count⌋: each level gets ⌊count/n⌋ or ⌈count/n⌉ strata.
    return strata.map((s) => Math.floor((s * n) / count));
  });
  const seen = new Set<string>();
  const out: number[][] = [];
  for (let i = 0; i < count; i++) {
    const v = columns.map((c) => c[i]);
    const key = v.join(",");
    if (!seen.has(key)) {
      seen.add(key);
      out.push(v);
    }
  }
  return out;
}

export function buildVariants(spec: Pick<SearchSpec, "dimensions" | "maxVariants" | "seed">): VariantPlan {
  const sizes = spec.dimensions.map((d) => d.values.length);
  const size = gridSize(spec.dimensions);
  if (size <= spec.maxVariants) return { method: "grid", gridSize: size, variants: fullGrid(sizes) };
  return { method: "sample", gridSize: size, variants: latinHypercube(sizes, spec.maxVariants, spec.seed) };
}

/** The scenario definition of one variant: a copy of `base` with each dimension set to its chosen level. */
export function applyVariant(base: ScenarioInput, dims: readonly SearchDimension[], choice: readonly number[]): ScenarioInput {
  const s = structuredClone(base);
  dims.forEach((d, i) => {
    const level = choice[i];
    switch (d.kind) {
      case "crews":
      case "shifts":
        s.operations = s.operations.map((op) => {
          if (op.id !== d.operation || op.kind !== "crew") return op;
          return d.kind === "crews" ? { ...op, crews: d.values[level] } : { ...op, shifts: [...d.values[level]] };
        });
        break;
      case "closureWindows": {
        const allowed = new Set(d.values[level]);
        s.calendar.closureWindows = s.calendar.closureWindows.filter((_, w) => allowed.has(w));
        break;
      }
      case "season": {
        const v = d.values[level];
        const { cutoffDate: _d, cutoffStationFt: _s, ...rest } = s.calendar.season;
        s.calendar.season = v.plan === "single" ? { ...rest, plan: "single" } : { ...rest, plan: "two", cutoffDate: v.cutoffDate, cutoffStationFt: v.cutoffStationFt };
        break;
      }
      case "holidayPolicy":
        s.calendar.holidays = { ...s.calendar.holidays, policy: d.values[level] };
        break;
      case "startDate":
        s.startDate = d.values[level];
        break;
    }
  });
  return s;
}

/** A short, readable label of one level, for tables and saved-variant names. */
export function levelLabel(d: SearchDimension, level: number): string {
  switch (d.kind) {
    case "crews":
      return `${d.operation}: ${d.values[level]} crew${d.values[level] === 1 ? "" : "s"}`;
    case "shifts":
      return `${d.operation}: ${d.values[level].join(" + ")}`;
    case "closureWindows":
      return `windows ${d.values[level].map((w) => w + 1).join(", ")}`;
    case "season": {
      const v = d.values[level];
      return v.plan === "single" ? "one season" : `two seasons (cut-off ${v.cutoffDate})`;
    }
    case "holidayPolicy":
      return d.values[level] === "workThrough" ? "work through holidays" : "stand down for holidays";
    case "startDate":
      return `start ${d.values[level]}`;
  }
}

export function variantLabel(dims: readonly SearchDimension[], choice: readonly number[]): string {
  return dims.map((d, i) => levelLabel(d, choice[i])).join(" · ");
}

/** Whole numbers from `from` to `to` by `step` (a form's "range"), at most 50. */
export function intRange(from: number, to: number, step = 1): number[] {
  const out: number[] = [];
  for (let v = from; step > 0 ? v <= to : false; v += step) {
    out.push(v);
    if (out.length >= 50) break;
  }
  return out;
}

/** Problems of a spec against the plan it varies (unknown operations, shifts or windows), with their paths. */
export function specProblems(plan: Pick<ScenarioInput, "operations" | "calendar">, spec: Pick<SearchSpec, "dimensions" | "fromFieldLog">): { path: string; message: string }[] {
  const problems: { path: string; message: string }[] = [];
  const crewIds = new Set(plan.operations.filter((o) => o.kind === "crew").map((o) => o.id));
  const shiftIds = new Set(plan.calendar.shifts.map((s) => s.id));
  const windows = plan.calendar.closureWindows.length;
  spec.dimensions.forEach((d, i) => {
    const at = `spec.dimensions[${i}]`;
    if ((d.kind === "crews" || d.kind === "shifts") && !crewIds.has(d.operation)) problems.push({ path: `${at}.operation`, message: `"${d.operation}" is not a crew operation of this plan` });
    if (d.kind === "shifts")
      d.values.forEach((set, j) => set.forEach((sh) => !shiftIds.has(sh) && problems.push({ path: `${at}.values[${j}]`, message: `"${sh}" is not a shift of this plan` })));
    if (d.kind === "closureWindows")
      d.values.forEach((set, j) => set.forEach((w) => w >= windows && problems.push({ path: `${at}.values[${j}]`, message: `window ${w + 1} does not exist (the plan has ${windows})` })));
    // The field log says when the work started; a search of the rest of the job cannot move it.
    if (d.kind === "startDate" && spec.fromFieldLog) problems.push({ path: at, message: "start dates cannot vary in a search from the field log: the work has started" });
  });
  const kinds = spec.dimensions.map((d) => (d.kind === "crews" || d.kind === "shifts" ? `${d.kind}:${d.operation}` : d.kind));
  kinds.forEach((k, i) => kinds.indexOf(k) !== i && problems.push({ path: `spec.dimensions[${i}]`, message: "varies the same thing as an earlier dimension" }));
  return problems;
}
