/**
 * The revision of the model rules (MODEL.md) the engine implements. A stored run is named by its inputs
 * (scenario version, seed, iterations, field log) and this number, so after a rule change the same inputs are
 * computed again instead of answered from a result the old rules gave. Raise it in the same commit as a rule
 * change that moves results (the one that rewrites tests/fixtures/golden-runs.json).
 *
 * 1: every rule up to December 2026. 2: a shift that starts in a stand-down or a winter is not worked at all
 * (MODEL.md, condition 3).
 */
export const MODEL_REVISION = 2;
