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
} as const satisfies Record<string, readonly ProjectRole[]>;
export type Action = keyof typeof ACTIONS;

export function can(role: ProjectRole | null | undefined, action: Action): boolean {
  return !!role && (ACTIONS[action] as readonly string[]).includes(role);
}
