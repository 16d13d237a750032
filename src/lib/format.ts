/** Display helpers shared by server and client components. */
import { format, isValid, parseISO } from "date-fns";

/** 1,250 ft → "STA 12+50" (1 station = 100 ft). */
export function formatStation(ft: number): string {
  const sign = ft < 0 ? "−" : "";
  const abs = Math.abs(ft);
  const sta = Math.floor(abs / 100);
  const rest = abs - sta * 100;
  const restText = rest.toFixed(rest % 1 === 0 ? 0 : 1).padStart(2, "0");
  return `STA ${sign}${sta}+${restText}`;
}

// Every date label goes through date-fns with one set of patterns, so months read the same everywhere ("Sep",
// never "Sept" as some locales' Intl data has it).
export const DATE_PATTERN = "d MMM yyyy";

/** "2027-10-14" → "14 Oct 2027" (a local calendar date: parsed and formatted in the same local time). */
export function formatIsoDate(iso: string | null | undefined): string {
  if (!iso) return "—";
  const d = parseISO(iso.slice(0, 10));
  return isValid(d) ? format(d, DATE_PATTERN) : iso;
}

export function formatDateTime(d: Date | string): string {
  const date = typeof d === "string" ? new Date(d) : d;
  return isValid(date) ? format(date, `${DATE_PATTERN}, HH:mm`) : String(d);
}

/** Month 1–12 → "Sep" (`long`: "September"). */
export function monthName(month: number, long = false): string {
  return format(new Date(2001, month - 1, 1), long ? "MMMM" : "MMM");
}

export function formatPercent(p: number | null | undefined, digits = 0): string {
  return p == null ? "—" : `${(p * 100).toFixed(digits)} %`;
}
