// The Stages section's pure helpers: form values that mean what the saved stages mean, order repairs after a
// move or a removal, the proposed next stage, the standing-closure mode and station notation.
import { readdirSync, readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { resolveStages } from "@sim/stages";
import { parseScenario } from "@sim/validate";
import { sectionOf, toFormValues } from "@/components/plan-editor/plan-logic";
import { newStage, parseStationText, repairStageOrder, stageFormValues, standingMode, withoutOperation, type StageValues } from "@/components/plan-editor/stages-logic";

const demo = (file: string) => JSON.parse(readFileSync(new URL(`../../scenarios/${file}`, import.meta.url), "utf8"));
const demos = readdirSync(new URL("../../scenarios/", import.meta.url)).filter((f) => f.endsWith(".json"));

const stage = (id: string, lanes: string[], after?: string): StageValues => ({ id, name: id, lanes, standingLanesClosed: lanes, ...(after ? { after: { stage: after, when: "stageDone", lagFt: 0, lagHours: 0 } } : {}) });

describe("stage form values", () => {
  it.each(demos)("%s: the form's values parse and resolve to the same stages as the file", (file) => {
    const raw = demo(file);
    const before = parseScenario(raw);
    expect(before.ok).toBe(true);
    const after = parseScenario(JSON.parse(JSON.stringify(toFormValues(raw))));
    expect(after.ok).toBe(true);
    if (before.ok && after.ok) expect(resolveStages(after.scenario)).toEqual(resolveStages(before.scenario));
  });

  it("spells out the default 'after' of later stages and drops one on the first stage", () => {
    const out = stageFormValues([{ ...stage("a", ["L1"]), after: { stage: "x" } }, { id: "b", name: "B", lanes: ["L2"] }]);
    expect(out[0].after).toBeUndefined();
    expect(out[1].after).toEqual({ stage: "a", when: "stageDone", lagFt: 0, lagHours: 0 });
    // A stage without a standing list gets its lanes (the schema's default), every optional number is present.
    expect(out[1].standingLanesClosed).toEqual(["L2"]);
    expect(Object.keys(out[1])).toEqual(expect.arrayContaining(["fromStationFt", "toStationFt", "capacityVehPerHour"]));
  });

  it("keeps a restored-ahead link and its lags", () => {
    const out = stageFormValues([stage("a", ["L1"]), { ...stage("b", ["L2"]), after: { stage: "a", when: "restoredAhead", lagFt: 300, lagHours: 12 } }]);
    expect(out[1].after).toEqual({ stage: "a", when: "restoredAhead", lagFt: 300, lagHours: 12 });
  });
});

describe("repairStageOrder", () => {
  it("a stage moved to the front follows nothing, and the old first stage now follows it", () => {
    const moved = repairStageOrder([stage("b", ["L2"], "a"), stage("a", ["L1"]), stage("c", ["L3"], "b")]);
    expect(moved.map((s) => s.after?.stage)).toEqual([undefined, "b", "b"]);
  });
  it("after a removal a stage that followed the removed one follows its new previous stage, keeping its lags", () => {
    const list = [stage("a", ["L1"]), { ...stage("c", ["L3"]), after: { stage: "b", when: "restoredAhead" as const, lagFt: 200, lagHours: 6 } }];
    expect(repairStageOrder(list)[1].after).toEqual({ stage: "a", when: "restoredAhead", lagFt: 200, lagHours: 6 });
  });
  it("leaves a valid link to an earlier, not previous, stage alone", () => {
    const list = [stage("a", ["L1"]), stage("b", ["L2"], "a"), stage("c", ["L3"], "a")];
    expect(repairStageOrder(list)[2].after?.stage).toBe("a");
  });
});

describe("newStage", () => {
  it("proposes the lanes no stage works on yet, behind barrier, after the last stage, with a fresh id", () => {
    const s = newStage([stage("stage-2", ["L1"])], ["L1", "L2", "L3"]);
    expect(s.lanes).toEqual(["L2", "L3"]);
    expect(s.standingLanesClosed).toEqual(["L2", "L3"]);
    expect(s.after).toEqual({ stage: "stage-2", when: "stageDone", lagFt: 0, lagHours: 0 });
    expect(s.id).toBe("stage-2-2");
    expect(s.name).toBe("Stage 2");
  });
  it("proposes every lane when every lane is taken; a first stage follows nothing", () => {
    expect(newStage([stage("a", ["L1", "L2"])], ["L1", "L2"]).lanes).toEqual(["L1", "L2"]);
    expect(newStage([], ["L1"]).after).toBeUndefined();
  });
  it("a staged plan built with it validates", () => {
    const raw = demo("kestrel-single-season.json");
    const form = toFormValues(raw);
    const first = { ...form.stages[0], lanes: [form.deck.lanes[0]], standingLanesClosed: [form.deck.lanes[0]] };
    // Without the traffic section: which lanes traffic may lose is the validator's business, not this helper's.
    const parsed = parseScenario({ ...form, traffic: undefined, stages: [first, newStage([first], form.deck.lanes)] });
    if (!parsed.ok) throw new Error(parsed.problems.map((p) => `${p.path}: ${p.message}`).join("; "));
    expect(parsed.scenario.stages).toHaveLength(2);
  });
});

describe("withoutOperation", () => {
  it("drops a removed operation from stages that list it; stages running every operation are untouched", () => {
    const list = [{ ...stage("a", ["L1"]), operations: ["mill", "pour"] }, stage("b", ["L2"], "a")];
    const out = withoutOperation(list, "pour");
    expect(out[0].operations).toEqual(["mill"]);
    expect(out[1]).toBe(list[1]);
  });
});

describe("standingMode", () => {
  it("names the three choices", () => {
    expect(standingMode(["L1"], ["L1"])).toBe("same");
    expect(standingMode(["L1", "L2"], ["L2", "L1"])).toBe("same");
    expect(standingMode(["L1"], ["L1", "L2"])).toBe("more");
    expect(standingMode(["L1"], [])).toBe("none");
    expect(standingMode(["L1"], undefined)).toBe("same");
  });
});

describe("parseStationText", () => {
  it("reads station notation and feet; empty is unset; anything else is refused", () => {
    expect(parseStationText("12+50")).toBe(1250);
    expect(parseStationText("STA 12+50")).toBe(1250);
    expect(parseStationText(" sta. 0+05.5 ")).toBe(5.5);
    expect(parseStationText("1,250")).toBe(1250);
    expect(parseStationText("1250.5")).toBe(1250.5);
    expect(parseStationText("")).toBeUndefined();
    expect(parseStationText("12+500")).toBeNull();
    expect(parseStationText("-5")).toBeNull();
    expect(parseStationText("twelve")).toBeNull();
  });
});

describe("sectionOf", () => {
  it("sends stage problems to the Stages section", () => {
    expect(sectionOf("stages[1].after.stage")).toBe("stages");
    expect(sectionOf("definition.stages[0].standingLanesClosed")).toBe("stages");
  });
});
