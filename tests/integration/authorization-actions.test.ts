/**
 * Server actions × every caller. Actions are found from "use server" files and each must have a row. Every row
 * also has a control — the rightful caller succeeds through the same encoding — so a refusal in the matrix
 * is the action refusing, not a request the framework never understood.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { createHash, randomBytes, randomUUID } from "node:crypto";
import { call, DEMO_PASSWORD } from "../helpers/app";
import { discoverServerActions } from "../helpers/route-inventory";
import { buildWorld, CALLERS, isRole, newAccount, tokenOf, unknownToken, type Caller, type World } from "../helpers/authz-world";
import { builtActionIds, form, invokeAction, type ActionReply } from "../helpers/server-action";
import { INVITE_PROBLEM } from "../../src/app/(auth)/invite/[token]/messages";

let w: World;
let ids: Map<string, string>;
beforeAll(async () => {
  w = await buildWorld();
  ids = builtActionIds();
}, 120_000);
afterAll(async () => {
  await w?.db.end();
});

const sha256 = (s: string) => createHash("sha256").update(s).digest("hex");
const cookieOf = (c: Caller): string | null => (isRole(c) || c === "otherProjectAdmin" ? w.cookies[c] : tokenOf(w, c) ? `pourline_session=${tokenOf(w, c)}` : null);

/** A live invitation to Kestrel written straight into the database, so its token is known without reading mail. */
async function liveInvitation(email: string): Promise<{ token: string; id: string }> {
  const token = randomBytes(32).toString("base64url");
  const adminId = (await call("/api/auth/session", { cookie: w.cookies.admin })).body.user.id;
  const [row] = await w.db`INSERT INTO invitations (project_id, email, role, token_hash, invited_by, expires_at)
    VALUES (${w.projectId}, ${email}, 'viewer', ${sha256(token)}, ${adminId}, now() + interval '7 days') RETURNING id`;
  return { token, id: row.id };
}
const isMember = async (email: string) => (await call(`/api/projects/${w.projectId}/members`, { cookie: w.cookies.admin })).body.members.some((m: { email: string }) => m.email === email);
const freshCookie = async (email: string) => (await call("/api/auth/signin", { method: "POST", body: { email, password: DEMO_PASSWORD } })).headers.get("set-cookie")!.split(";")[0];

interface Cell {
  page: string;
  args: unknown[];
  cookie?: string | null;
  /** "redirect:/path" when the action must go through, otherwise the message it must refuse with. */
  outcome: string;
  after?: (r: ActionReply) => Promise<void>;
}
interface ActionRow {
  cell: (c: Caller) => Promise<Cell>;
  control: () => Promise<Cell>;
}

const ROWS: Record<string, ActionRow> = {
  // Public: anyone may sign in with the right password, whatever they hold already.
  "src/app/(auth)/signin/actions.ts#signInAction": {
    cell: async () => ({ page: "/signin", args: [{}, form({ email: (await newAccount(w.db, "action-signin")).email, password: DEMO_PASSWORD })], outcome: "redirect:/projects" }),
    control: async () => ({ page: "/signin", args: [{}, form({ email: (await newAccount(w.db, "action-signin")).email, password: DEMO_PASSWORD })], outcome: "redirect:/projects" }),
  },
  // Public: signing out always lands on the sign-in page and ends the session it was sent with.
  "src/app/(auth)/signin/actions.ts#signOutAction": {
    cell: async (c) => {
      const own = isRole(c) || c === "otherProjectAdmin" ? await freshCookie((await newAccount(w.db, "action-signout")).email) : cookieOf(c);
      return {
        page: "/projects",
        args: [new FormData()],
        cookie: own,
        outcome: "redirect:/signin",
        after: async () => {
          if (own) expect((await call("/api/auth/session", { cookie: own })).status).toBe(401);
        },
      };
    },
    control: async () => ({ page: "/projects", args: [new FormData()], cookie: await freshCookie((await newAccount(w.db, "action-signout")).email), outcome: "redirect:/signin" }),
  },
  // Only an invitation token opens it: a share or feed token, or a session, is no invitation.
  "src/app/(auth)/invite/[token]/actions.ts#acceptWithNewAccountAction": {
    cell: async (c) => {
      const token = tokenOf(w, c) ?? unknownToken();
      return { page: `/invite/${token}`, args: [{}, form({ token, name: "Not Invited", password: "a-long-password-1", confirm: "a-long-password-1" })], outcome: INVITE_PROBLEM.unknown };
    },
    control: async () => {
      const email = `${randomUUID().slice(0, 8)}@invitee.example`;
      const inv = await liveInvitation(email);
      return {
        page: `/invite/${inv.token}`,
        args: [{}, form({ token: inv.token, name: "Invited Person", password: "a-long-password-1", confirm: "a-long-password-1" })],
        cookie: null,
        outcome: "redirect:/projects",
        after: async () => expect(await isMember(email)).toBe(true),
      };
    },
  },
  "src/app/(auth)/invite/[token]/actions.ts#acceptWithSignInAction": {
    cell: async (c) => {
      const token = tokenOf(w, c) ?? unknownToken();
      return { page: `/invite/${token}`, args: [{}, form({ token, password: DEMO_PASSWORD })], outcome: INVITE_PROBLEM.unknown };
    },
    control: async () => {
      const account = await newAccount(w.db, "invitee");
      const inv = await liveInvitation(account.email);
      return { page: `/invite/${inv.token}`, args: [{}, form({ token: inv.token, password: DEMO_PASSWORD })], cookie: null, outcome: "redirect:/projects", after: async () => expect(await isMember(account.email)).toBe(true) };
    },
  },
  // A live invitation for someone else: no caller may take it, signed in or not; it stays unused.
  "src/app/(auth)/invite/[token]/actions.ts#acceptSignedInAction": {
    cell: async (c) => {
      const account = await newAccount(w.db, "invitee");
      const inv = await liveInvitation(account.email);
      return {
        page: `/invite/${inv.token}`,
        args: [{}, form({ token: inv.token })],
        outcome: isRole(c) || c === "otherProjectAdmin" ? INVITE_PROBLEM.wrong_account : "Your session has ended",
        after: async () => {
          const [row] = await w.db`SELECT used_at FROM invitations WHERE id = ${inv.id}`;
          expect(row.used_at).toBeNull();
          expect(await isMember(account.email)).toBe(false);
        },
      };
    },
    control: async () => {
      const account = await newAccount(w.db, "invitee");
      const inv = await liveInvitation(account.email);
      return { page: `/invite/${inv.token}`, args: [{}, form({ token: inv.token })], cookie: await freshCookie(account.email), outcome: "redirect:/projects", after: async () => expect(await isMember(account.email)).toBe(true) };
    },
  },
};

const discovered = discoverServerActions();

async function run(cell: Cell, caller: Caller | "control", key: string) {
  const id = ids.get(key);
  expect(id, `${key} is not in the build's server-reference manifest`).toBeTruthy();
  const cookie = cell.cookie !== undefined ? cell.cookie : caller === "control" ? null : cookieOf(caller);
  const r = await invokeAction(cell.page, id!, cell.args, { cookie });
  const where = `${key} as ${caller}: ${r.status} ${r.redirect ?? ""} ${r.text.slice(0, 200)}`;
  if (cell.outcome.startsWith("redirect:")) {
    expect(r.redirect, where).toBe(cell.outcome.slice("redirect:".length));
  } else {
    expect(r.redirect, where).toBeNull();
    expect(r.status, where).toBeLessThan(500);
    expect(r.text, where).toContain(cell.outcome);
  }
  await cell.after?.(r);
}

describe("server actions", () => {
  it("every server action has a row, and every row an action", () => {
    expect(discovered.length).toBeGreaterThanOrEqual(5);
    expect(discovered.filter((k) => !(k in ROWS)), "actions without a row").toEqual([]);
    expect(Object.keys(ROWS).filter((k) => !discovered.includes(k)), "rows without an action").toEqual([]);
  });

  describe.each(Object.keys(ROWS).filter((k) => discovered.includes(k)))("%s", (key) => {
    it("control: the rightful caller gets through", async () => run(await ROWS[key].control(), "control", key));
    it.each(CALLERS)("as %s", async (caller) => run(await ROWS[key].cell(caller), caller, key));
    it("from another site's origin: refused with a 403 and a plain message, nothing done", async () => {
      const cell = await ROWS[key].control();
      const r = await invokeAction(cell.page, ids.get(key)!, cell.args, { cookie: cell.cookie ?? null, origin: "http://evil.example" });
      expect(r.status, `${key}: ${r.text.slice(0, 200)}`).toBe(403);
      expect(r.redirect).toBeNull();
      expect(r.setCookie ?? "").not.toMatch(/pourline_session=[^;]+/);
    });
  });
});
