/**
 * The database schema. Migrations under db/migrations are generated from this file with
 * `npm run db:generate` and committed; an applied migration is never edited, a change is a new one.
 */
import { sql, type InferInsertModel, type InferSelectModel } from "drizzle-orm";
import {
  bigint,
  boolean,
  check,
  type AnyPgColumn,
  customType,
  date,
  doublePrecision,
  index,
  integer,
  jsonb,
  pgEnum,
  pgTable,
  primaryKey,
  text,
  timestamp,
  uniqueIndex,
  uuid,
} from "drizzle-orm/pg-core";
import { ROLES } from "./schema-enums";
import type { SearchSpec } from "../sim/search";
import type { PlanOutcome } from "../sim/frontier";
import type { RunSummary } from "../sim/run-summary-schema";
import type { ProgressEntry } from "../sim/progress-entry";
import type { ProgressRecord } from "../sim/asbuilt";

const bytea = customType<{ data: Buffer; driverData: Buffer }>({ dataType: () => "bytea" });
const ts = (name: string) => timestamp(name, { withTimezone: true, mode: "date" });

export { ROLES };
export type Role = (typeof ROLES)[number];
export const roleEnum = pgEnum("project_role", ROLES);

export const users = pgTable("users", {
  id: text("id").primaryKey(),
  email: text("email").notNull().unique(),
  name: text("name").notNull(),
  title: text("title").notNull().default(""),
  passwordHash: text("password_hash"),
  createdAt: ts("created_at").notNull().defaultNow(),
});
export type User = InferSelectModel<typeof users>;

/** `id` is the SHA-256 of the cookie's token (src/lib/server/auth.ts); the token itself is never stored. */
export const sessions = pgTable("sessions", {
  id: text("id").primaryKey(),
  userId: text("user_id")
    .notNull()
    .references(() => users.id, { onDelete: "cascade" }),
  expiresAt: ts("expires_at").notNull(),
  /** Sign-in time: a session ends SESSION_ABSOLUTE_MS after it however often it is renewed. */
  createdAt: ts("created_at").notNull().defaultNow(),
});

/** Failed sign-ins per key ("account:<email>" or "address:<ip>") in a sliding window. */
export const signInAttempts = pgTable("sign_in_attempts", {
  key: text("key").primaryKey(),
  failures: integer("failures").notNull().default(0),
  windowStart: ts("window_start").notNull().defaultNow(),
  lockedUntil: ts("locked_until"),
});

export const projects = pgTable("projects", {
  id: uuid("id").primaryKey().defaultRandom(),
  name: text("name").notNull(),
  structureName: text("structure_name").notNull(),
  region: text("region").notNull().default(""),
  deckLengthFt: doublePrecision("deck_length_ft").notNull(),
  startStationFt: doublePrecision("start_station_ft").notNull(),
  lanes: jsonb("lanes").$type<string[]>().notNull(),
  description: text("description").notNull().default(""),
  /** Where the structure is, for the weather forecast (set by an admin or engineer; null = not set). */
  latitude: doublePrecision("latitude"),
  longitude: doublePrecision("longitude"),
  createdAt: ts("created_at").notNull().defaultNow(),
  /**
   * When an administrator archived the project (null = in use). An archived project is kept as a record: it can
   * be read, but nothing in it changes until it is restored (src/lib/permissions.ts `ARCHIVED_STILL_ALLOWS`).
   */
  archivedAt: ts("archived_at"),
  archivedById: text("archived_by_id").references(() => users.id, { onDelete: "set null" }),
  /**
   * The plan of record: the scenario the project is run by and its owner is told about (chosen by an
   * administrator or engineer; null = none yet). Its latest forecast is the project's headline on the project list.
   */
  planScenarioId: uuid("plan_scenario_id").references((): AnyPgColumn => scenarios.id, { onDelete: "set null" }),
  /**
   * The newest forecast of the plan of record that its forecast e-mail has gone out for (or that stood when the plan
   * was chosen): a newer one is announced once to the members who asked (src/lib/server/forecast-alerts.ts).
   */
  planAnnouncedRunId: uuid("plan_announced_run_id").references((): AnyPgColumn => simulationRuns.id, { onDelete: "set null" }),
  /**
   * The daily re-forecast of the plan of record: the local hour (0–23, the plan's time zone) after which the server
   * re-forecasts it from the field log as of the day before (null = off; src/lib/server/daily-reforecast.ts), who
   * set it up (the runs are theirs) and the last local date it was considered, so it happens once a day.
   * 0–23 (a CHECK constraint in the migration).
   */
  dailyReforecastHour: integer("daily_reforecast_hour"),
  dailyReforecastById: text("daily_reforecast_by").references(() => users.id, { onDelete: "set null" }),
  dailyReforecastLastOn: date("daily_reforecast_last_on"),
  /** What that day's look decided, in words ("re-forecast from 3 Dec 2026: 2 field-log changes …"). */
  dailyReforecastNote: text("daily_reforecast_note"),
  /**
   * The weekly closure e-mail to the project's closure-notice subscribers: the local weekday (0 = Sunday … 6) and
   * hour (0–23, the published plan's time zone) after which the week ahead of the standing publication is sent
   * (both null = off; src/lib/server/closure-weekly.ts), the last local date it was sent or skipped for, so it
   * happens once, and what that day did, in words. CHECK constraints in the migration: the ranges, both or neither.
   */
  closureWeeklyDay: integer("closure_weekly_day"),
  closureWeeklyHour: integer("closure_weekly_hour"),
  closureWeeklyLastOn: date("closure_weekly_last_on"),
  closureWeeklyNote: text("closure_weekly_note"),
});
export type Project = InferSelectModel<typeof projects>;

export const projectMembers = pgTable(
  "project_members",
  {
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    role: roleEnum("role").notNull(),
    addedAt: ts("added_at").notNull().defaultNow(),
    /** This member asked for an e-mail with each new forecast of the project's plan of record. */
    forecastAlerts: boolean("forecast_alerts").notNull().default(false),
  },
  (t) => [primaryKey({ columns: [t.projectId, t.userId] })],
);

export const scenarios = pgTable(
  "scenarios",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    name: text("name").notNull(),
    description: text("description").notNull().default(""),
    /** A scenario definition that passed `parseScenario` (sim/validate). */
    definition: jsonb("definition").$type<Record<string, unknown>>().notNull(),
    version: integer("version").notNull().default(1),
    ownerId: text("owner_id")
      .notNull()
      .references(() => users.id),
    updatedById: text("updated_by")
      .notNull()
      .references(() => users.id),
    changeNote: text("change_note").notNull().default(""),
    createdAt: ts("created_at").notNull().defaultNow(),
    updatedAt: ts("updated_at").notNull().defaultNow(),
  },
  (t) => [index("scenarios_project_idx").on(t.projectId)],
);
export type ScenarioRow = InferSelectModel<typeof scenarios>;

/** Every saved version, so a conflict can show both sides and history can say who changed what. */
export const scenarioRevisions = pgTable(
  "scenario_revisions",
  {
    scenarioId: uuid("scenario_id")
      .notNull()
      .references(() => scenarios.id, { onDelete: "cascade" }),
    version: integer("version").notNull(),
    definition: jsonb("definition").$type<Record<string, unknown>>().notNull(),
    savedById: text("saved_by")
      .notNull()
      .references(() => users.id),
    changeNote: text("change_note").notNull().default(""),
    savedAt: ts("saved_at").notNull().defaultNow(),
  },
  (t) => [primaryKey({ columns: [t.scenarioId, t.version] })],
);

export const simulationRuns = pgTable(
  "simulation_runs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    scenarioId: uuid("scenario_id")
      .notNull()
      .references(() => scenarios.id, { onDelete: "cascade" }),
    scenarioVersion: integer("scenario_version").notNull(),
    inputsHash: text("inputs_hash").notNull(),
    seed: text("seed").notNull(),
    iterations: integer("iterations").notNull(),
    /** Small headline figures (P50/P80/P90 …) for lists and compare. */
    summary: jsonb("summary").$type<Record<string, unknown>>().notNull(),
    /**
     * The full run summary (the run-result contract, sim/run-summary-schema.ts): histogram, curve, per-operation
     * table, representative trace; a re-forecast adds the digest of its as-built state.
     */
    results: jsonb("results").$type<StoredRunResults>().notNull(),
    durationMs: integer("duration_ms").notNull().default(0),
    /** Set for a re-forecast: the run started from the as-built state at this data date (null = the plan). */
    dataDate: date("data_date"),
    createdById: text("created_by").references(() => users.id),
    createdAt: ts("created_at").notNull().defaultNow(),
    /**
     * `server`: computed by an engine job; `pending`: computed in a browser, not yet reproduced by the server;
     * `verified`: reproduced exactly; `rejected`: the server got a different summary (never shown as a forecast).
     */
    verification: text("verification").$type<RunVerification>().notNull().default("pending"),
    /** scenario:version:seed:iterations:model revision:kind:data date (+ as-built hash): the same computation is stored once. */
    resultKey: text("result_key"),
    /**
     * The revision of the model rules the run was computed under (sim/model-revision.ts). No default: every insert
     * says it; rows stored before the column are revision 1. A run of older rules is marked (stale.ts `olderRulesSql`).
     */
    modelRevision: integer("model_revision").notNull(),
    /**
     * `results` as its readers are sent it (GET /api/runs/:id), made once when the run is stored
     * (db/stored-results.ts) so a read never parses or serialises it: the JSON raw-deflated and left open (sync
     * flush) for the route to wrap in one gzip stream with the run's current marks, the JSON's CRC-32 and byte
     * length for the gzip trailer, and its SHA-256 (the results' part of the ETag). Null on a row stored before
     * these columns: filled on its first read.
     */
    resultsDeflate: bytea("results_deflate"),
    resultsCrc32: bigint("results_crc32", { mode: "number" }),
    resultsLength: integer("results_length"),
    resultsEtag: text("results_etag"),
  },
  (t) => [
    index("runs_scenario_idx").on(t.scenarioId, t.createdAt),
    uniqueIndex("runs_result_key_idx").on(t.resultKey),
    // The stored copy is whole or absent, never half-written.
    check("runs_stored_results_whole", sql`num_nonnulls(${t.resultsDeflate}, ${t.resultsCrc32}, ${t.resultsLength}, ${t.resultsEtag}) in (0, 4)`),
  ],
);
export type SimulationRun = InferSelectModel<typeof simulationRuns>;
/** What `simulation_runs.results` holds. Over JSON an unfinished representative's finishHours reads back as null. */
export type StoredRunResults = RunSummary & { reforecast?: Record<string, unknown> };
export type RunVerification = "server" | "pending" | "verified" | "rejected";

/**
 * What a share-link token opens: the read-only scenario page and its JSON, only the closure calendar feed, or
 * one plan search (its frontier and table; `search_id` names it, and only a search link has one).
 */
export const SHARE_SCOPES = ["scenario", "closure-feed", "search"] as const;
export type ShareScope = (typeof SHARE_SCOPES)[number];
export const shareScopeEnum = pgEnum("share_scope", SHARE_SCOPES);

export const shareLinks = pgTable(
  "share_links",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    scope: shareScopeEnum("scope").notNull().default("scenario"),
    scenarioId: uuid("scenario_id")
      .notNull()
      .references(() => scenarios.id, { onDelete: "cascade" }),
    /** The plan search a "search" link opens (a search of `scenario_id`); null for every other scope. */
    searchId: uuid("search_id").references((): AnyPgColumn => planSearches.id, { onDelete: "cascade" }),
    /** SHA-256 of the token; the token itself is shown once and never stored. */
    tokenHash: text("token_hash").notNull(),
    label: text("label").notNull().default(""),
    createdById: text("created_by")
      .notNull()
      .references(() => users.id),
    expiresAt: ts("expires_at").notNull(),
    revokedAt: ts("revoked_at"),
    createdAt: ts("created_at").notNull().defaultNow(),
  },
  (t) => [
    uniqueIndex("share_links_token_idx").on(t.tokenHash),
    index("share_links_search_idx").on(t.searchId),
    // A search link names its search and no other link does. Compared as text: a new enum value may not be
    // used in the transaction that adds it, and migrations run in one.
    check("share_links_search_scope", sql`(${t.scope}::text = 'search') = (${t.searchId} is not null)`),
  ],
);

export const uploads = pgTable("uploads", {
  id: uuid("id").primaryKey().defaultRandom(),
  projectId: uuid("project_id")
    .notNull()
    .references(() => projects.id, { onDelete: "cascade" }),
  scenarioId: uuid("scenario_id").references(() => scenarios.id, { onDelete: "set null" }),
  kind: text("kind").notNull(),
  filename: text("filename").notNull(),
  contentType: text("content_type").notNull(),
  sizeBytes: integer("size_bytes").notNull(),
  content: bytea("content").notNull(),
  rowCount: integer("row_count").notNull().default(0),
  uploadedById: text("uploaded_by")
    .notNull()
    .references(() => users.id),
  uploadedAt: ts("uploaded_at").notNull().defaultNow(),
});

export const progressEntries = pgTable(
  "progress_entries",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    scenarioId: uuid("scenario_id").references(() => scenarios.id, { onDelete: "set null" }),
    workDate: date("work_date").notNull(),
    shift: text("shift").notNull(),
    operationId: text("operation_id").notNull(),
    fromStationFt: doublePrecision("from_station_ft").notNull(),
    toStationFt: doublePrecision("to_station_ft").notNull(),
    crew: text("crew").notNull().default(""),
    tempF: doublePrecision("temp_f"),
    rain: boolean("rain").notNull().default(false),
    lostHours: doublePrecision("lost_hours").notNull().default(0),
    lostReason: text("lost_reason").notNull().default(""),
    discovered: jsonb("discovered").$type<ProgressEntry["discovered"]>().notNull().default(sql`'[]'::jsonb`),
    version: integer("version").notNull().default(1),
    enteredById: text("entered_by")
      .notNull()
      .references(() => users.id),
    createdAt: ts("created_at").notNull().defaultNow(),
    updatedAt: ts("updated_at").notNull().defaultNow(),
    // Deleting a shift keeps it on record (who, when): a field record does not vanish, and a forecast that used it
    // is known to be behind the field (db/queries/progress.ts `shiftsNotInRun`). Every read of the log skips these.
    deletedAt: ts("deleted_at"),
    deletedById: text("deleted_by").references(() => users.id),
  },
  (t) => [index("progress_project_idx").on(t.projectId, t.workDate)],
);

export const progressHistory = pgTable("progress_history", {
  id: uuid("id").primaryKey().defaultRandom(),
  entryId: uuid("entry_id")
    .notNull()
    .references(() => progressEntries.id, { onDelete: "cascade" }),
  changedById: text("changed_by")
    .notNull()
    .references(() => users.id),
  changedAt: ts("changed_at").notNull().defaultNow(),
  /** What the change did: a restore and a creation both have no `before`, so the row says which. */
  action: text("action", { enum: ["create", "edit", "delete", "restore"] }).notNull(),
  /** Null when the entry was created or put back. */
  before: jsonb("before"),
  /** Null when the entry was deleted. */
  after: jsonb("after"),
});

export const emailOutbox = pgTable(
  "email_outbox",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    /** Who caused the e-mail and on which project: what the sending quotas count (null for password resets). */
    requestedById: text("requested_by").references(() => users.id, { onDelete: "set null" }),
    projectId: uuid("project_id").references(() => projects.id, { onDelete: "set null" }),
    toAddress: text("to_address").notNull(),
    subject: text("subject").notNull(),
    textBody: text("text_body").notNull(),
    htmlBody: text("html_body"),
    status: text("status").notNull().default("pending"),
    attempts: integer("attempts").notNull().default(0),
    lastError: text("last_error"),
    nextAttemptAt: ts("next_attempt_at").notNull().defaultNow(),
    createdAt: ts("created_at").notNull().defaultNow(),
    sentAt: ts("sent_at"),
  },
  (t) => [
    index("outbox_pending_idx").on(t.status, t.nextAttemptAt),
    index("outbox_requested_by_idx").on(t.requestedById, t.createdAt),
    index("outbox_project_idx").on(t.projectId, t.createdAt),
  ],
);

export type NewScenario = InferInsertModel<typeof scenarios>;

/**
 * An e-mailed invitation to join a project. Like share links, only the SHA-256 of the 256-bit token is
 * stored; `used_at` makes it single use.
 */
export const invitations = pgTable(
  "invitations",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    role: roleEnum("role").notNull(),
    tokenHash: text("token_hash").notNull(),
    invitedById: text("invited_by")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    expiresAt: ts("expires_at").notNull(),
    usedAt: ts("used_at"),
    createdAt: ts("created_at").notNull().defaultNow(),
  },
  (t) => [uniqueIndex("invitations_token_idx").on(t.tokenHash), index("invitations_project_idx").on(t.projectId)],
);

/** A password-reset link: hashed token, short expiry, single use. */
export const passwordResets = pgTable(
  "password_resets",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    userId: text("user_id")
      .notNull()
      .references(() => users.id, { onDelete: "cascade" }),
    tokenHash: text("token_hash").notNull(),
    expiresAt: ts("expires_at").notNull(),
    usedAt: ts("used_at"),
    createdAt: ts("created_at").notNull().defaultNow(),
  },
  (t) => [uniqueIndex("password_resets_token_idx").on(t.tokenHash)],
);

/** People outside the team (public information office, partner agencies) told when a closure plan is published. */
export const closureSubscribers = pgTable(
  "closure_subscribers",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    email: text("email").notNull(),
    label: text("label").notNull().default(""),
    addedById: text("added_by")
      .notNull()
      .references(() => users.id),
    createdAt: ts("created_at").notNull().defaultNow(),
  },
  (t) => [uniqueIndex("closure_subscribers_project_email_idx").on(t.projectId, t.email)],
);

/** Each time a scenario's planned closures were published, with the run they came from and the feed link. */
export const closurePublications = pgTable("closure_publications", {
  id: uuid("id").primaryKey().defaultRandom(),
  scenarioId: uuid("scenario_id")
    .notNull()
    .references(() => scenarios.id, { onDelete: "cascade" }),
  runId: uuid("run_id")
    .notNull()
    .references(() => simulationRuns.id, { onDelete: "cascade" }),
  shareLinkId: uuid("share_link_id")
    .notNull()
    .references(() => shareLinks.id, { onDelete: "cascade" }),
  closureCount: integer("closure_count").notNull(),
  notified: integer("notified").notNull(),
  publishedById: text("published_by")
    .notNull()
    .references(() => users.id),
  publishedAt: ts("published_at").notNull().defaultNow(),
});

/** Which of a search's inputs a stored plan search varied, and how its variants were built. */
export const planSearches = pgTable(
  "plan_searches",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    scenarioId: uuid("scenario_id")
      .notNull()
      .references(() => scenarios.id, { onDelete: "cascade" }),
    scenarioVersion: integer("scenario_version").notNull(),
    name: text("name").notNull(),
    /** A `searchSpecSchema` value (sim/search). */
    spec: jsonb("spec").$type<SearchSpec>().notNull(),
    method: text("method").$type<"grid" | "sample">().notNull(),
    gridSize: integer("grid_size").notNull(),
    /**
     * A search from the field log (`spec.fromFieldLog`): the field log's shifts as they stood when it was started,
     * so every plan of it starts from the same as-built state however the log changes meanwhile; null otherwise.
     */
    fieldLog: jsonb("field_log").$type<ProgressRecord[]>(),
    /** The revision of the model rules its plans are computed under (sim/model-revision.ts), as on simulation_runs. */
    modelRevision: integer("model_revision").notNull(),
    createdById: text("created_by")
      .notNull()
      .references(() => users.id),
    createdAt: ts("created_at").notNull().defaultNow(),
  },
  (t) => [index("plan_searches_scenario_idx").on(t.scenarioId, t.createdAt)],
);

/** One plan of a search: index 0 is the scenario as saved, 1… the variants. */
export const planSearchVariants = pgTable(
  "plan_search_variants",
  {
    searchId: uuid("search_id")
      .notNull()
      .references(() => planSearches.id, { onDelete: "cascade" }),
    idx: integer("idx").notNull(),
    /** Level index per dimension; null for the scenario as saved. */
    choice: jsonb("choice").$type<number[] | null>(),
    label: text("label").notNull(),
    status: text("status").$type<"pending" | "done" | "infeasible" | "failed">().notNull().default("pending"),
    outcome: jsonb("outcome").$type<PlanOutcome | null>(),
    /** Why the variant could not be run (an invalid plan, or the engine failed). */
    problem: text("problem"),
    bossJobId: uuid("boss_job_id").notNull(),
    finishedAt: ts("finished_at"),
  },
  (t) => [primaryKey({ columns: [t.searchId, t.idx] })],
);

/**
 * Engine work the web server asked for: runs, re-forecasts, verifications of browser runs and plan searches.
 * pg-boss carries the work to a worker; this row is what people see (status, progress, result) and what a
 * worker checks before it starts, so a cancelled or finished job is never computed again.
 */
export const engineJobs = pgTable(
  "engine_jobs",
  {
    id: uuid("id").primaryKey().defaultRandom(),
    kind: text("kind").$type<EngineJobKind>().notNull(),
    projectId: uuid("project_id")
      .notNull()
      .references(() => projects.id, { onDelete: "cascade" }),
    scenarioId: uuid("scenario_id")
      .notNull()
      .references(() => scenarios.id, { onDelete: "cascade" }),
    scenarioVersion: integer("scenario_version").notNull(),
    seed: text("seed").notNull(),
    iterations: integer("iterations").notNull(),
    dataDate: date("data_date"),
    /** verify: the run to check; run / reforecast: the stored result once done. */
    runId: uuid("run_id").references(() => simulationRuns.id, { onDelete: "set null" }),
    searchId: uuid("search_id").references(() => planSearches.id, { onDelete: "cascade" }),
    /** The pg-boss job (one per job; a search has one per variant, on plan_search_variants). */
    bossJobId: uuid("boss_job_id"),
    singletonKey: text("singleton_key").notNull(),
    status: text("status").$type<EngineJobStatus>().notNull().default("queued"),
    doneUnits: integer("done_units").notNull().default(0),
    totalUnits: integer("total_units").notNull(),
    timeLimitSeconds: integer("time_limit_seconds").notNull(),
    error: text("error"),
    createdById: text("created_by").references(() => users.id, { onDelete: "set null" }),
    /**
     * Asked for by the daily re-forecast (in `created_by`'s name) rather than by that person pressing a button: the
     * record says which, so a forecast nobody pressed for is not read as someone's decision.
     */
    automatic: boolean("automatic").notNull().default(false),
    createdAt: ts("created_at").notNull().defaultNow(),
    startedAt: ts("started_at"),
    finishedAt: ts("finished_at"),
  },
  (t) => [
    // Idempotent enqueue: one live or finished job per computation; a failed or cancelled one may be asked for again.
    uniqueIndex("engine_jobs_singleton_idx").on(t.singletonKey).where(sql`status in ('queued', 'running', 'completed')`),
    index("engine_jobs_scenario_idx").on(t.scenarioId, t.createdAt),
  ],
);
export type EngineJobKind = "run" | "reforecast" | "verify" | "search";
export type EngineJobStatus = "queued" | "running" | "completed" | "failed" | "cancelled";

/** Worker processes alive now (each refreshes its row every few seconds). */
export const engineWorkers = pgTable("engine_workers", {
  id: uuid("id").primaryKey(),
  host: text("host").notNull(),
  pid: integer("pid").notNull(),
  threads: integer("threads").notNull(),
  startedAt: ts("started_at").notNull().defaultNow(),
  heartbeatAt: ts("heartbeat_at").notNull().defaultNow(),
});

/** The pg-boss jobs a worker process holds; when its heartbeat stops, another worker hands them back to the queue. */
export const engineLeases = pgTable("engine_leases", {
  bossJobId: uuid("boss_job_id").primaryKey(),
  workerId: uuid("worker_id")
    .notNull()
    .references(() => engineWorkers.id, { onDelete: "cascade" }),
  startedAt: ts("started_at").notNull().defaultNow(),
});

/**
 * The last hourly forecast fetched for a project, shared by everyone who reads it (src/lib/server/forecast/
 * cache.ts): at most one fetch per project per hour. `data` keeps the last good forecast when a later
 * attempt fails, so the board can still show it with its age.
 */
export const projectForecasts = pgTable("project_forecasts", {
  projectId: uuid("project_id")
    .primaryKey()
    .references(() => projects.id, { onDelete: "cascade" }),
  /** The location the forecast is for: a changed location makes it stale at once. */
  latitude: doublePrecision("latitude").notNull(),
  longitude: doublePrecision("longitude").notNull(),
  data: jsonb("data").$type<Record<string, unknown>>(),
  fetchedAt: ts("fetched_at"),
  lastAttemptAt: ts("last_attempt_at"),
  lastError: text("last_error"),
});

/** The daily look-ahead e-mail of a scenario: to whom, at which local hour, and what was sent last. */
export const lookAheadNotices = pgTable("look_ahead_notices", {
  scenarioId: uuid("scenario_id")
    .primaryKey()
    .references(() => scenarios.id, { onDelete: "cascade" }),
  enabled: boolean("enabled").notNull().default(true),
  recipients: jsonb("recipients").$type<string[]>().notNull(),
  /** Local hour of the scenario's time zone, 0–23. */
  hour: integer("hour").notNull(),
  lastSentOn: date("last_sent_on"),
  /** The compact board of the last notice, to say what changed. */
  lastBoard: jsonb("last_board").$type<Record<string, unknown>>(),
  updatedById: text("updated_by")
    .notNull()
    .references(() => users.id),
  updatedAt: ts("updated_at").notNull().defaultNow(),
});
