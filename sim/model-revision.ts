/**
 * The revision of the model rules (MODEL.md) the engine implements. A stored run is named by its inputs
 * (scenario version, seed, iterations, field log) and this number, so after a rule change the same inputs are
 * computed again instead of answered from a result the old rules gave, and a run stored under older rules is
 * marked as such. Raise it in the same commit as a rule change that moves results (the one that rewrites
 * tests/fixtures/golden-runs.json), and say in MODEL_CHANGES what changed, in words a planner reads.
 */
export const MODEL_REVISION = 2;

/** What each revision after the first changed (revision 1: every rule up to December 2026). */
export const MODEL_CHANGES: Readonly<Record<number, string>> = {
  2: "a shift that starts in a holiday stand-down or a winter shutdown is no longer worked at all, not even its hours after the stand-down ends",
};
