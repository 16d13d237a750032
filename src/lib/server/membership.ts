import "server-only";
/** Wording shared by every route that changes a role (the rule itself lives in changeMembership, db/queries/projects). */
export const LAST_ADMIN = "A project needs at least one administrator; make someone else an administrator before changing or removing this one.";
