import { describe, expect, it } from "vitest";
import { olderRulesText, rulesChangedSince } from "@/lib/model-rules-text";
import { MODEL_CHANGES, MODEL_REVISION } from "@sim/model-revision";

describe("older model rules in words", () => {
  it("every revision after the first says what it changed", () => {
    for (let r = 2; r <= MODEL_REVISION; r++) expect([r, (MODEL_CHANGES[r] ?? "").length > 20]).toEqual([r, true]);
  });

  it("lists the changes after the run's revision, oldest first, and none for today's", () => {
    expect(rulesChangedSince(1)).toEqual(Array.from({ length: MODEL_REVISION - 1 }, (_, i) => MODEL_CHANGES[i + 2]));
    expect(rulesChangedSince(MODEL_REVISION)).toEqual([]);
    expect(olderRulesText("This run", 1)).toBe(`This run was computed under earlier model rules; since then ${rulesChangedSince(1).join("; and ")}.`);
    expect(olderRulesText("This run", MODEL_REVISION)).toBe("This run was computed under earlier model rules.");
  });
});
