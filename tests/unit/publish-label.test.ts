import { describe, expect, it } from "vitest";
import { publishLabel } from "../../src/app/(app)/scenarios/[scenarioId]/share/publish-label";

describe("the publish button's words", () => {
  it("says whom it notifies, in words", () => {
    expect(publishLabel(0)).toBe("Publish closures (no one to notify)…");
    expect(publishLabel(1)).toBe("Publish closures and notify 1 subscriber…");
    expect(publishLabel(2)).toBe("Publish closures and notify 2 subscribers…");
  });
});
