/**
 * Pure helpers of the plan editor (no React, no DOM), unit-tested in tests/unit/plan-editor-logic.test.ts.
 * Contract: `proposeLink` refuses self-links, duplicates and links that would close a loop, naming the loop
 * (the graph's layout is graph-layout.ts); `diffDefinitions` lists every leaf
 * that differs between two definitions with a schema-style path; `toFormPath` and `sectionOf` map problem paths
 * (from `parseScenario` or the server) to react-hook-form names and to the editor section that shows them.
 */
import { scenarioSchema, type ScenarioInput } from "@sim/schema";
import { upgradeScenario } from "@sim/upgrade";
import { stageFormValues } from "./stages-logic";

export interface LinkLike {
  from: string;
  to: string;
}

/** Operation ids reachable from `start` to `goal` along existing links (shortest), or null. */
export function findPath(links: readonly LinkLike[], start: string, goal: string): string[] | null {
  const prev = new Map<string, string | null>([[start, null]]);
  const queue = [start];
  while (queue.length) {
    const v = queue.shift()!;
    if (v === goal) {
      const path: string[] = [];
      for (let c: string | null = v; c !== null; c = prev.get(c) ?? null) path.unshift(c);
      return path;
    }
    for (const l of links) {
      if (l.from === v && !prev.has(l.to)) {
        prev.set(l.to, v);
        queue.push(l.to);
      }
    }
  }
  return null;
}

export type LinkVerdict = { ok: true } | { ok: false; message: string };

/** Whether `from → to` may be added. `label` turns ids into the names people see (defaults to the id). */
export function proposeLink(
  operationIds: readonly string[],
  links: readonly LinkLike[],
  from: string,
  to: string,
  label: (id: string) => string = (id) => id,
): LinkVerdict {
  if (!operationIds.includes(from) || !operationIds.includes(to)) return { ok: false, message: "Refused: both ends must be operations of this plan." };
  if (from === to) return { ok: false, message: `Refused: ${label(from)} → ${label(from)} would loop (an operation cannot follow itself).` };
  if (links.some((l) => l.from === from && l.to === to)) return { ok: false, message: `Refused: ${label(from)} → ${label(to)} is already linked.` };
  const back = findPath(links, to, from);
  if (back) return { ok: false, message: `Refused: ${[from, ...back].map(label).join(" → ")} would loop.` };
  return { ok: true };
}

export interface Difference {
  path: string;
  before: string;
  after: string;
}

export function formatValue(v: unknown): string {
  if (v === undefined) return "(not set)";
  if (typeof v === "string") return JSON.stringify(v);
  const text = JSON.stringify(v);
  return text.length > 80 ? `${text.slice(0, 77)}…` : text;
}

const isObject = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);

/** Every leaf that differs, `theirs → mine`, with paths like `operations[4].rate.dist.mode`. */
export function diffDefinitions(theirs: unknown, mine: unknown, path = ""): Difference[] {
  if (Array.isArray(theirs) && Array.isArray(mine)) {
    const out: Difference[] = [];
    for (let i = 0; i < Math.max(theirs.length, mine.length); i++) out.push(...diffDefinitions(theirs[i], mine[i], `${path}[${i}]`));
    return out;
  }
  if (isObject(theirs) && isObject(mine)) {
    const keys = [...new Set([...Object.keys(theirs), ...Object.keys(mine)])].sort();
    return keys.flatMap((k) => diffDefinitions(theirs[k], mine[k], path ? `${path}.${k}` : k));
  }
  if (Object.is(theirs, mine)) return [];
  return [{ path: path || "(root)", before: formatValue(theirs), after: formatValue(mine) }];
}

/** `definition.operations[3].rate.dist.max` → `operations.3.rate.dist.max`. */
export function toFormPath(problemPath: string): string {
  return problemPath.replace(/^definition\.?/, "").replace(/\[(\d+)\]/g, ".$1").replace(/^\./, "");
}

export type SectionId = "sequence" | "stages" | "crews" | "calendar" | "weather" | "traffic";

const SEQUENCE_OP_FIELDS = new Set(["id", "name", "kind"]);

export function sectionOf(problemPath: string): SectionId {
  const p = toFormPath(problemPath).split(".");
  if (p[0] === "weather") return "weather";
  if (p[0] === "stages") return "stages";
  if (p[0] === "traffic" || p[0] === "costs") return "traffic";
  if (p[0] === "calendar" || p[0] === "startDate" || p[0] === "targetDate" || p[0] === "deck" || p[0] === "timeZone") return "calendar";
  if (p[0] === "operations") {
    if (p.length <= 1) return "sequence";
    if (p.length === 2) return "crews";
    return SEQUENCE_OP_FIELDS.has(p[2]) ? "sequence" : "crews";
  }
  return "sequence";
}

/** Fills the schema's defaults in so the form has every field and two versions compare like for like. */
export function normalizeDefinition(definition: unknown): ScenarioInput {
  const current = upgradeScenario(definition);
  const parsed = scenarioSchema.safeParse(current);
  return (parsed.success ? parsed.data : current) as ScenarioInput;
}

/** A fresh, lower-case id not yet used, derived from a name. */
export function freshId(name: string, taken: readonly string[]): string {
  const base = name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-+|-+$/g, "").slice(0, 32) || "operation";
  let id = base;
  for (let n = 2; taken.includes(id); n++) id = `${base}-${n}`;
  return id;
}

type Dist = { type: "fixed"; value: number } | { type: "triangular" | "pert"; min: number; mode: number; max: number } | { type: "lognormal"; median: number; sigma: number };

/** Switches a distribution's type, keeping its central value (and min/max between triangular and PERT). */
export function convertDist(d: Dist, type: Dist["type"]): Dist {
  if (d.type === type) return d;
  const c = d.type === "fixed" ? d.value : d.type === "lognormal" ? d.median : d.mode;
  const centre = Number.isFinite(c) && c > 0 ? c : 1;
  const r = (x: number) => Math.round(x * 100) / 100;
  if (type === "fixed") return { type, value: centre };
  if (type === "lognormal") return { type, median: centre, sigma: 0.2 };
  if (d.type === "triangular" || d.type === "pert") return { type, min: d.min, mode: d.mode, max: d.max };
  return { type, min: r(centre * 0.8), mode: centre, max: r(centre * 1.25) };
}

const GATE_KEYS = ["minTempF", "maxTempF", "noRainHoursAfter", "maxWindMph", "maxEvaporation", "concreteDeltaF"] as const;

/**
 * The form's starting values: schema defaults filled, and every optional field present (unset optional
 * numbers as `undefined`, unset gate switches as `false`), so a field that mounts does not itself make the
 * form dirty and two versions diff like for like. `undefined` keys vanish in JSON, so nothing is saved for them.
 */
export function toFormValues(definition: unknown): ScenarioInput {
  const v = structuredClone(normalizeDefinition(definition)) as ScenarioInput;
  if (!Array.isArray(v.operations)) return v;
  if (Array.isArray(v.stages)) v.stages = stageFormValues(v.stages);
  v.targetDate = v.targetDate ?? undefined;
  if (v.calendar?.season) {
    v.calendar.season.cutoffDate = v.calendar.season.cutoffDate ?? undefined;
    v.calendar.season.cutoffStationFt = v.calendar.season.cutoffStationFt ?? undefined;
  }
  for (const op of v.operations) {
    if (op.kind === "wait") {
      op.countAboveF = op.countAboveF ?? undefined;
      continue;
    }
    if (op.kind !== "crew") continue;
    const g: Record<string, unknown> = { ...(op.gates ?? {}) };
    for (const k of GATE_KEYS) g[k] = g[k] ?? undefined;
    g.rising = g.rising ?? false;
    g.noRain = g.noRain ?? false;
    // Both halves present (blank = undefined): an empty pair parses to "no protection".
    const pa = (g.protectAfter ?? {}) as { minTempF?: number; hours?: number };
    g.protectAfter = { minTempF: pa.minTempF ?? undefined, hours: pa.hours ?? undefined };
    op.gates = g as typeof op.gates;
  }
  return v;
}
