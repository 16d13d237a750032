/**
 * The role table with a project's archive: archiving never gives a role anything, leaves reading and the archive's
 * own allowances (members, restoring) to those who had them, and takes every other change from every role.
 */
import { describe, expect, it } from "vitest";
import { ACTIONS, ARCHIVED_STILL_ALLOWS, ROLE_LABELS, can, type Action, type ProjectRole } from "@/lib/permissions";

const roles = Object.keys(ROLE_LABELS) as ProjectRole[];
const actions = Object.keys(ACTIONS) as Action[];

describe("can, with the project archived", () => {
  it("never allows what the role may not do in a project in use", () => {
    for (const r of roles) for (const a of actions) if (can(r, a, true)) expect(can(r, a), `${r} ${a}`).toBe(true);
  });
  it("keeps reading for every role, and members and restoring for administrators", () => {
    for (const r of roles) expect(can(r, "read", true), r).toBe(true);
    expect(can("admin", "manageMembers", true)).toBe(true);
    expect(can("admin", "archiveProject", true)).toBe(true);
  });
  it("takes plans, runs, sharing, the field log and the project's details from every role", () => {
    for (const r of roles)
      for (const a of ["editScenario", "runScenario", "shareScenario", "recordProgress", "editProject"] as Action[]) expect(can(r, a, true), `${r} ${a}`).toBe(false);
  });
  it("only administrators archive, and nobody signed out can do anything", () => {
    expect(roles.filter((r) => can(r, "archiveProject"))).toEqual(["admin"]);
    for (const a of actions) expect(can(null, a)).toBe(false);
    expect(ARCHIVED_STILL_ALLOWS.every((a) => actions.includes(a))).toBe(true);
  });
});
