import "server-only";
/**
 * Reads the local mail catcher's store (scripts/fake-smtp.ts writes one JSON file per message into
 * POURLINE_MAILBOX_DIR). Used by the dev mailbox page and by tests; never by the product's own flows.
 */
import { readdirSync, readFileSync } from "node:fs";
import { join, resolve } from "node:path";

export interface CaughtMessage {
  id: string;
  receivedAt: string;
  from: string;
  to: string[];
  subject: string;
  text: string;
  html: string | null;
}

/**
 * The /dev/mailbox page exists only when the machine's owner switched it on for local use: POURLINE_DEV_MAILBOX=1
 * (set by `npm start` / `npm test` for their own local mail catcher, never by default) and mail going to the
 * local catcher (POURLINE_FAKE_SMTP=1). Even then it shows a signed-in person only mail addressed to them.
 */
export function mailCatcherPageEnabled(env: Record<string, string | undefined> = process.env): boolean {
  return env.POURLINE_DEV_MAILBOX === "1" && env.POURLINE_FAKE_SMTP === "1";
}

/** Caught messages addressed to `email` (case-insensitive), newest first: what its owner may read. */
export function listMailboxFor(email: string, { dir = mailboxDir() }: { dir?: string } = {}): CaughtMessage[] {
  const want = email.trim().toLowerCase();
  return listMailbox({ dir }).filter((m) => m.to.some((t) => t.trim().toLowerCase() === want));
}

export function mailboxDir(): string {
  // turbopackIgnore: the folder is chosen at run time; without it the bundler traces the whole project (and warns).
  return resolve(/*turbopackIgnore: true*/ process.env.POURLINE_MAILBOX_DIR || ".data/mailbox");
}

/** Every stored message, newest first. A missing folder is an empty mailbox. */
export function listMailbox({ dir = mailboxDir() }: { dir?: string } = {}): CaughtMessage[] {
  let names: string[];
  try {
    names = readdirSync(/*turbopackIgnore: true*/ dir).filter((n) => n.endsWith(".json") && !n.startsWith("."));
  } catch {
    return [];
  }
  const out: CaughtMessage[] = [];
  for (const n of names) {
    try {
      out.push(JSON.parse(readFileSync(/*turbopackIgnore: true*/ join(/*turbopackIgnore: true*/ dir, n), "utf8")) as CaughtMessage);
    } catch {
      // A file someone else put there; not ours to show.
    }
  }
  return out.sort((a, b) => b.receivedAt.localeCompare(a.receivedAt));
}

/** The newest message to `to` (case-insensitive) whose subject contains `subject`, or null. */
export function findMail({ to, subject = "", dir }: { to: string; subject?: string; dir?: string }): CaughtMessage | null {
  const want = to.toLowerCase();
  return listMailbox({ dir }).find((m) => m.to.some((t) => t.toLowerCase() === want) && m.subject.includes(subject)) ?? null;
}

/** The first link in a message's text that points at `path` (e.g. "/invite/"). */
export function linkIn(message: CaughtMessage, path: string): string | null {
  const found = message.text.match(/https?:\/\/[^\s<>"]+/g) ?? [];
  return found.find((u) => new URL(u).pathname.startsWith(path)) ?? null;
}
