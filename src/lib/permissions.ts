/**
 * What each project role may do. The server checks these on every route handler and action;
 * the client uses the same table only to decide which buttons to show.
 */
export const ROLE_LABELS = {
  admin: "Administrator",
  engineer: "Engineer",
  scheduler: "Scheduler",
  inspector: "Inspector",
  viewer: "Viewer",
} as const;
export type ProjectRole = keyof typeof ROLE_LABELS;

export const ACTIONS = {
  read: ["admin", "engineer", "scheduler", "inspector", "viewer"],
  editScenario: ["admin", "engineer", "scheduler"],
  runScenario: ["admin", "engineer", "scheduler"],
  shareScenario: ["admin", "engineer", "scheduler"],
  manageMembers: ["admin"],
  recordProgress: ["admin", "engineer", "inspector"],
  editProject: ["admin", "engineer"],
  archiveProject: ["admin"],
} as const satisfies Record<string, readonly ProjectRole[]>;
export type Action = keyof typeof ACTIONS;

/**
 * What an archived project still allows. It is kept as a record of what was planned and built, so it can be read,
 * its administrators still decide who may read it, and they may restore it; its plans, runs, field log, details,
 * links and notices do not change until then. (Taking something away — a share link, a subscriber — is allowed
 * by the routes that do it: an archive must never keep a record exposed.)
 */
export const ARCHIVED_STILL_ALLOWS: readonly Action[] = ["read", "manageMembers", "archiveProject"];

/** The answer to a change an archived project does not allow (409: the role may, the project's state may not). */
export const ARCHIVED_REFUSAL = "This project is archived, so nothing in it can be changed. An administrator can restore it on the project page.";

/** `archived`: the project is archived (then only `ARCHIVED_STILL_ALLOWS`). */
export function can(role: ProjectRole | null | undefined, action: Action, archived = false): boolean {
  return !!role && (ACTIONS[action] as readonly string[]).includes(role) && (!archived || ARCHIVED_STILL_ALLOWS.includes(action));
}
