/** Enum values the client may import without pulling in the database schema. */
export const ROLES = ["admin", "engineer", "scheduler", "inspector", "viewer"] as const;
