import "server-only";
import { z } from "zod";
import { getProjectWithRole } from "@db/queries/projects";
import { getScenario } from "@db/queries/scenarios";
import { ARCHIVED_REFUSAL, can, type Action, type ProjectRole } from "@/lib/permissions";
import { currentSession, type SignedIn } from "./auth";
import { AppError } from "./errors";

const uuid = z.uuid();

export async function requireUser(): Promise<SignedIn> {
  return requireSignedIn(await currentSession());
}

/** 401 for nobody signed in. */
export function requireSignedIn(s: SignedIn | null): SignedIn {
  if (!s) throw new AppError("unauthorized", "Sign in to continue.");
  return s;
}

export const isUuid = (id: string) => uuid.safeParse(id).success;

/**
 * What a request does with what it asks for, which decides whether an archived project stops it: "look" only reads
 * (a page or a GET, whatever permission it needs to see the thing), "change" writes, "takeAway" removes access or
 * stops work (revoking a link, removing a subscriber, cancelling a run) — allowed in an archive, which must never
 * keep a record exposed. By default a request with the `read` permission looks and any other changes.
 */
export type Intent = "look" | "change" | "takeAway";

/**
 * The one rule after the lookup: no role (not a member) is 404 with `notFound` — the same answer as a thing
 * that does not exist, so nothing hints that it does; a role that may not do `action` is 403; a change to an
 * archived project that the archive does not allow is 409 (the role may, the project's state may not).
 */
export function requireRole(role: ProjectRole | null, action: Action, notFound: string, archived = false, intent: Intent = action === "read" ? "look" : "change"): ProjectRole {
  if (!role) throw new AppError("not_found", notFound);
  if (!can(role, action)) throw new AppError("forbidden", `Your role (${role}) may not do this.`);
  if (intent === "change" && !can(role, action, archived)) throw new AppError("conflict", ARCHIVED_REFUSAL);
  return role;
}

/** 404 when the project does not exist or the user is not a member (no hint that it exists); 403 when the role may not. */
export async function requireProject(projectId: string, action: Action, intent?: Intent) {
  return requireProjectAs(await requireUser(), projectId, action, intent);
}

/** requireProject for a person already signed in (the read routes served beside Next decide the session themselves). */
export async function requireProjectAs(s: SignedIn, projectId: string, action: Action, intent?: Intent) {
  if (!uuid.safeParse(projectId).success) throw new AppError("not_found", "No such project.");
  // One query: the project and the person's membership (the role table decides the rest).
  const found = await getProjectWithRole({ projectId, userId: s.user.id });
  if (!found) throw new AppError("not_found", "No such project.");
  const archived = found.project.archivedAt !== null;
  const role = requireRole(found.role as ProjectRole | null, action, "No such project.", archived, intent);
  return { ...s, role, project: found.project, archived };
}

export async function requireScenario(scenarioId: string, action: Action, intent?: Intent) {
  const s = await requireUser();
  if (!uuid.safeParse(scenarioId).success) throw new AppError("not_found", "No such scenario.");
  const scenario = await getScenario({ id: scenarioId });
  if (!scenario) throw new AppError("not_found", "No such scenario.");
  const found = await getProjectWithRole({ projectId: scenario.projectId, userId: s.user.id });
  if (!found) throw new AppError("not_found", "No such scenario.");
  const archived = found.project.archivedAt !== null;
  const role = requireRole(found.role as ProjectRole | null, action, "No such scenario.", archived, intent);
  return { ...s, role, scenario, project: found.project, archived };
}
