/**
 * A stage in one sentence, for the brief and the shared page's inputs (MODEL.md, "Stages"): its lanes, its
 * stretch of deck, what stands behind barrier while it is open, its operations and how it follows an
 * earlier stage. Pure text from a parsed scenario.
 */
import type { Scenario } from "@sim/schema";
import { formatStation } from "./format";

/** "Stage 2: North lanes" — or the name alone when it already says which stage it is ("Stage 2: …"). */
export function stageLabel(name: string, i: number): string {
  return new RegExp(`^\\s*stage\\s*${i + 1}\\b`, "i").test(name) ? name : `Stage ${i + 1}: ${name}`;
}

export function stageSentence(s: Scenario, i: number): string {
  const st = s.stages[i];
  const deckEnd = s.deck.startStationFt + s.deck.lengthFt;
  const from = st.fromStationFt ?? s.deck.startStationFt;
  const to = st.toStationFt ?? deckEnd;
  const where = from === s.deck.startStationFt && to === deckEnd ? "over the whole deck" : `from ${formatStation(from)} to ${formatStation(to)}`;
  const standing = st.standingLanesClosed.length
    ? `${st.standingLanesClosed.join(", ")} behind barrier round the clock until restored`
    : "no barrier between shifts (short-term closures only)";
  const opName = new Map(s.operations.map((o) => [o.id, o.name]));
  const ops = st.operations ? `; operations: ${st.operations.map((id) => opName.get(id) ?? id).join(", ")}` : "";
  let follows = "";
  if (i > 0) {
    const after = st.after ?? { stage: s.stages[i - 1].id, when: "stageDone" as const, lagFt: 0, lagHours: 0 };
    const k = s.stages.findIndex((x) => x.id === after.stage);
    const lag = [after.when === "restoredAhead" && after.lagFt ? `${after.lagFt.toLocaleString("en-US")} ft` : "", after.lagHours ? `${after.lagHours} h` : ""].filter(Boolean).join(" and ");
    follows =
      after.when === "stageDone"
        ? `; starts after stage ${k + 1} is finished${lag ? ` (+${lag})` : ""}`
        : `; follows stage ${k + 1} along the deck once it is restored${lag ? ` (${lag} behind)` : ""}`;
  }
  const capacity = st.capacityVehPerHour !== undefined ? `; traffic capacity ${st.capacityVehPerHour.toLocaleString("en-US")} veh/h per direction` : "";
  return `${stageLabel(st.name, i)} — lanes ${st.lanes.join(", ")} ${where}; ${standing}${ops}${follows}${capacity}.`;
}
