/**
 * A run computed under an earlier revision of the model rules (the data layer's `olderRules`), in words: what
 * changed since, so a planner can judge whether it matters to this plan before running it again.
 */
import { MODEL_CHANGES, MODEL_REVISION } from "@sim/model-revision";

/** The words for a result of an earlier revision of the rules, the same wherever one is shown. */
export const UNDER_OLDER_RULES = "computed under earlier model rules";

export function rulesChangedSince(revision: number): string[] {
  const out: string[] = [];
  for (let r = revision + 1; r <= MODEL_REVISION; r++) if (MODEL_CHANGES[r]) out.push(MODEL_CHANGES[r]);
  return out;
}

/** "computed under earlier model rules; since then, …" — the caller says what to do about it. */
export function olderRulesText(what: string, revision: number): string {
  const changes = rulesChangedSince(revision);
  return `${what} was ${UNDER_OLDER_RULES}${changes.length ? `; since then ${changes.join("; and ")}` : ""}.`;
}
