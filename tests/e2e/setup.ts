/** Runs around every e2e test: a test whose pages raised a content-security-policy violation fails, naming it. */
import { afterEach, expect } from "vitest";
import { takePolicyViolations } from "../helpers/browser";

afterEach(() => {
  expect(takePolicyViolations(), "content-security-policy violations in the browser").toEqual([]);
});
