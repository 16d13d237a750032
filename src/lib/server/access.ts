import "server-only";
import { z } from "zod";
import { getMembershipRole, getProjectWithRole } from "@db/queries/projects";
import { getScenario } from "@db/queries/scenarios";
import { can, type Action, type ProjectRole } from "@/lib/permissions";
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
 * The one rule after the lookup: no role (not a member) is 404 with `notFound` — the same answer as a thing
 * that does not exist, so nothing hints that it does; a role that may not do `action` is 403.
 */
export function requireRole(role: ProjectRole | null, action: Action, notFound: string): ProjectRole {
  if (!role) throw new AppError("not_found", notFound);
  if (!can(role, action)) throw new AppError("forbidden", `Your role (${role}) may not do this.`);
  return role;
}

/** 404 when the project does not exist or the user is not a member (no hint that it exists); 403 when the role may not. */
export async function requireProject(projectId: string, action: Action) {
  return requireProjectAs(await requireUser(), projectId, action);
}

/** requireProject for a person already signed in (the read routes served beside Next decide the session themselves). */
export async function requireProjectAs(s: SignedIn, projectId: string, action: Action) {
  if (!uuid.safeParse(projectId).success) throw new AppError("not_found", "No such project.");
  // One query: the project and the person's membership (the role table decides the rest).
  const found = await getProjectWithRole({ projectId, userId: s.user.id });
  if (!found) throw new AppError("not_found", "No such project.");
  const role = requireRole(found.role as ProjectRole | null, action, "No such project.");
  return { ...s, role, project: found.project };
}

export async function requireScenario(scenarioId: string, action: Action) {
  const s = await requireUser();
  if (!uuid.safeParse(scenarioId).success) throw new AppError("not_found", "No such scenario.");
  const scenario = await getScenario({ id: scenarioId });
  if (!scenario) throw new AppError("not_found", "No such scenario.");
  const role = requireRole((await getMembershipRole({ projectId: scenario.projectId, userId: s.user.id })) as ProjectRole | null, action, "No such scenario.");
  return { ...s, role, scenario };
}
