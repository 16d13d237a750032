/**
 * Runs in the browser before the app's own code (Next.js's client instrumentation hook). zod compiles object
 * parsers with `new Function` when it may, and probes for that on first use; under the page's content security
 * policy (no eval, src/lib/http/security-headers.ts) the probe fails quietly but is reported as a policy
 * violation on every page. Turning the compiler off skips the probe; parsing is the same, only interpreted.
 */
import { config } from "zod";

config({ jitless: true });
