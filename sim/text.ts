/**
 * Building blocks of every text and date field: plain text (no control characters: a NUL cannot be stored
 * by PostgreSQL and the others only hide things from the reader), real calendar dates and IANA time zones.
 * Pure JS (Intl is part of the language), so the browser's forms and the server judge alike.
 */
import { z } from "zod";
import { daysInMonth } from "./dates";

const MONTHS = ["Jan", "Feb", "Mar", "Apr", "May", "Jun", "Jul", "Aug", "Sep", "Oct", "Nov", "Dec"];

/** Control characters other than tab, line feed and carriage return (C0 and DEL). */
const CONTROL_MULTILINE = /[\u0000-\u0008\u000B\u000C\u000E-\u001F\u007F]/;
/** Every control character: a name or label is one line. */
const CONTROL_SINGLE_LINE = /[\u0000-\u001F\u007F]/;

const codePoint = (c: string) => `U+${c.charCodeAt(0).toString(16).toUpperCase().padStart(4, "0")}`;

/** The first forbidden control character in `s`, as `U+0000`, or null. */
export function controlCharacterIn(s: string, multiline = false): string | null {
  const m = (multiline ? CONTROL_MULTILINE : CONTROL_SINGLE_LINE).exec(s);
  return m ? codePoint(m[0]) : null;
}

const count = (n: number) => n.toLocaleString("en-US");

/**
 * A string of at most `max` characters without control characters (tab and new lines allowed when
 * `multiline`). `label` starts the messages ("Crew must be …") for forms that show them without a path.
 */
export function plainText(max: number, opts: { multiline?: boolean; label?: string } = {}) {
  const lead = opts.label ? `${opts.label} ` : "";
  return z
    .string()
    .max(max, { abort: true, error: (iss) => `${lead}must be at most ${count(max)} characters (got ${count(String(iss.input ?? "").length)})` })
    .superRefine((s, ctx) => {
      const bad = controlCharacterIn(s, opts.multiline);
      if (bad) ctx.addIssue({ code: "custom", message: `${lead}must not contain control characters (found ${bad}${opts.multiline ? "; only tabs and new lines are allowed" : ""})` });
    });
}

/** Whether `YYYY-MM-DD` names a day that exists (no 30 February, no month 13). */
export function isRealIsoDate(iso: string): boolean {
  const m = /^(\d{4})-(\d{2})-(\d{2})$/.exec(iso);
  if (!m) return false;
  const [y, mo, d] = [Number(m[1]), Number(m[2]), Number(m[3])];
  return mo >= 1 && mo <= 12 && d >= 1 && d <= daysInMonth(y, mo);
}

/** "30 Feb 2027" for a well-formed but unreal date (month names only when the month exists). */
function spoken(iso: string): string {
  const mo = Number(iso.slice(5, 7));
  return mo >= 1 && mo <= 12 ? `${Number(iso.slice(8, 10))} ${MONTHS[mo - 1]} ${iso.slice(0, 4)}` : iso;
}

/** A real calendar date `YYYY-MM-DD`. `label` starts the messages ("Work date must be …") when given. */
export function realIsoDate(label?: string) {
  const lead = label ? `${label} ` : "";
  return z
    .string()
    .max(10, { abort: true, error: `${lead}must be a date YYYY-MM-DD` })
    .regex(/^\d{4}-\d{2}-\d{2}$/, { abort: true, error: `${lead}must be a date YYYY-MM-DD` })
    .refine(isRealIsoDate, { error: (iss) => `${label ? `${label}: ` : ""}${spoken(String(iss.input))} is not a real date` });
}

const zoneVerdicts = new Map<string, boolean>();

/** Whether the runtime knows `zone` as an IANA time zone (e.g. "America/Chicago"). Remembered per name. */
export function isKnownTimeZone(zone: string): boolean {
  if (!zone || zone.length > 64) return false;
  let ok = zoneVerdicts.get(zone);
  if (ok === undefined) {
    try {
      new Intl.DateTimeFormat("en-US", { timeZone: zone });
      ok = true;
    } catch {
      ok = false;
    }
    if (zoneVerdicts.size < 1_000) zoneVerdicts.set(zone, ok);
  }
  return ok;
}
