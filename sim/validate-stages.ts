/**
 * Validation of stages and of what they leave open to traffic (MODEL.md, "Stages" and "Traffic"). Contract:
 * `stageProblems(scenario)` returns every problem with a readable path (`stages[1].after.stage`): duplicate
 * ids, unknown lanes and operations, an `after` that names no earlier stage, standing lanes that do not
 * contain the stage's lanes, station ranges off the deck, empty or holding no packet, and closures that can
 * leave a traffic direction with no open lane and no capacity override — a standing closure alone, two
 * standing closures that may stand together, or a standing closure with a short-term closure of its stage.
 */
import type { FieldProblem, Scenario } from "./schema";
import { resolveStages, stagesMayOverlap } from "./stages";

export function stageProblems(s: Scenario): FieldProblem[] {
  const out: FieldProblem[] = [];
  const lanes = new Set(s.deck.lanes);
  const opIds = new Set(s.operations.map((o) => o.id));
  const deckStart = s.deck.startStationFt;
  const deckEnd = deckStart + s.deck.lengthFt;
  const seen = new Map<string, number>();
  let refsOk = true;
  s.deck.lanes.forEach((l, i) => {
    if (s.deck.lanes.indexOf(l) !== i) out.push({ path: `deck.lanes[${i}]`, message: `lane "${l}" is listed twice` });
  });
  s.stages.forEach((st, i) => {
    const at = `stages[${i}]`;
    const j = seen.get(st.id);
    if (j !== undefined) out.push({ path: `${at}.id`, message: `duplicate stage id "${st.id}" (also stages[${j}])` });
    else seen.set(st.id, i);
    st.lanes.forEach((l, k) => {
      if (!lanes.has(l)) out.push({ path: `${at}.lanes[${k}]`, message: `unknown lane "${l}" (deck.lanes)` });
    });
    st.standingLanesClosed.forEach((l, k) => {
      if (!lanes.has(l)) out.push({ path: `${at}.standingLanesClosed[${k}]`, message: `unknown lane "${l}" (deck.lanes)` });
    });
    if (st.standingLanesClosed.length > 0) {
      const missing = st.lanes.filter((l) => !st.standingLanesClosed.includes(l));
      if (missing.length)
        out.push({ path: `${at}.standingLanesClosed`, message: `must contain every lane the stage works on (missing ${missing.join(", ")}), or be empty for no standing closure` });
    }
    st.operations?.forEach((o, k) => {
      if (!opIds.has(o)) {
        refsOk = false;
        out.push({ path: `${at}.operations[${k}]`, message: `unknown operation "${o}"` });
      } else if (st.operations!.indexOf(o) !== k) out.push({ path: `${at}.operations[${k}]`, message: `operation "${o}" is listed twice` });
    });
    if (st.after) {
      const k = s.stages.findIndex((x) => x.id === st.after!.stage);
      if (i === 0) {
        refsOk = false;
        out.push({ path: `${at}.after`, message: "the first stage follows no other stage" });
      } else if (k < 0 || k >= i) {
        refsOk = false;
        out.push({ path: `${at}.after.stage`, message: k < 0 ? `unknown stage "${st.after.stage}"` : `must name an earlier stage ("${st.after.stage}" is not listed before this one)` });
      }
      if (st.after.lagFt > s.deck.lengthFt)
        out.push({ path: `${at}.after.lagFt`, message: `lag of ${st.after.lagFt} ft is longer than the deck (${s.deck.lengthFt} ft)` });
    }
    const from = st.fromStationFt ?? deckStart;
    const to = st.toStationFt ?? deckEnd;
    if (from < deckStart || from > deckEnd)
      out.push({ path: `${at}.fromStationFt`, message: `station ${from} ft is outside the deck (${deckStart}–${deckEnd} ft)` });
    if (to < deckStart || to > deckEnd)
      out.push({ path: `${at}.toStationFt`, message: `station ${to} ft is outside the deck (${deckStart}–${deckEnd} ft)` });
    if (to <= from) out.push({ path: `${at}.toStationFt`, message: "must be greater than fromStationFt" });
  });
  if (refsOk) {
    const listed = new Set(s.stages.flatMap((st) => st.operations ?? s.operations.map((o) => o.id)));
    s.operations.forEach((o, i) => {
      if (!listed.has(o.id)) out.push({ path: `operations[${i}]`, message: `"${o.id}" runs in no stage: list it in a stage's operations` });
    });
  }
  if (!refsOk || out.length) return out;

  const stages = resolveStages(s);
  stages.forEach((st, i) => {
    if (st.lo >= st.hi)
      out.push({ path: `stages[${i}].toStationFt`, message: `the range holds no packet start (packets every ${s.deck.packetFt} ft from STA ${deckStart} ft)` });
  });
  out.push(...trafficLaneProblems(s, stages));
  return out;
}

/** A direction left with no open lane needs an override of the capacity in force (MODEL.md, "Traffic"). */
function trafficLaneProblems(s: Scenario, stages: ReturnType<typeof resolveStages>): FieldProblem[] {
  const t = s.traffic;
  if (!t || t.directions.length === 0) return [];
  const out: FieldProblem[] = [];
  const overlap = stagesMayOverlap(stages);
  const closures = new Map(s.calendar.closures.map((c) => [c.id, c]));
  const override = new Map(t.closures.map((c) => [c.closure, c.capacityVehPerHour]));
  const reported = new Set<string>();
  const report = (path: string, message: string) => {
    if (reported.has(path + message)) return;
    reported.add(path + message);
    out.push({ path, message });
  };
  for (const a of stages) {
    for (const b of stages) {
      if (b.index < a.index || !overlap[a.index][b.index]) continue;
      const standing = new Set([...a.standing, ...b.standing]);
      const standingOverride = (a.standing.length && a.capacityVehPerHour !== undefined) || (b.standing.length && b.capacityVehPerHour !== undefined);
      const both = a === b ? `stage "${a.id}"` : `stages "${a.id}" and "${b.id}" (they may stand together)`;
      t.directions.forEach((d) => {
        if (standing.size && d.lanes.every((l) => standing.has(l)) && !standingOverride)
          report(`stages[${b.index}].capacityVehPerHour`, `the standing closure of ${both} closes every lane of direction "${d.id}": set capacityVehPerHour (e.g. traffic on a crossover)`);
      });
      // Short-term closures of either stage's crew operations, stacked on both standing closures.
      for (const st of a === b ? [a] : [a, b]) {
        for (const oi of st.ops) {
          const op = s.operations[oi];
          if (op.kind !== "crew" || !op.closure) continue;
          const c = closures.get(op.closure);
          if (!c) continue;
          const closed = new Set([...standing, ...c.lanesClosed]);
          t.directions.forEach((d) => {
            if (!d.lanes.every((l) => closed.has(l))) return;
            const shortNarrows = d.lanes.some((l) => c.lanesClosed.includes(l));
            if (shortNarrows ? override.get(c.id) !== undefined : standingOverride) return;
            const ci = s.calendar.closures.indexOf(c);
            report(
              shortNarrows ? `calendar.closures[${ci}]` : `stages[${st.index}].capacityVehPerHour`,
              `closure "${c.id}" stacked on the standing closure of ${both} closes every lane of direction "${d.id}": ` +
                (shortNarrows ? `add traffic.closures[] for "${c.id}" with capacityVehPerHour (e.g. a crossover)` : "set the stage's capacityVehPerHour"),
            );
          });
        }
      }
    }
  }
  return out;
}
