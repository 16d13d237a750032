/** Display helpers shared by server and client components. */

/** 1,250 ft → "STA 12+50" (1 station = 100 ft). */
export function formatStation(ft: number): string {
  const sign = ft < 0 ? "−" : "";
  const abs = Math.abs(ft);
  const sta = Math.floor(abs / 100);
  const rest = abs - sta * 100;
  const restText = rest.toFixed(rest % 1 === 0 ? 0 : 1).padStart(2, "0");
  return `STA ${sign}${sta}+${restText}`;
}

const dateFmt = new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", timeZone: "UTC" });

/** "2027-10-14" → "14 Oct 2027" (a local calendar date, so formatted without shifting time zones). */
export function formatIsoDate(iso: string | null | undefined): string {
  if (!iso) return "—";
  const d = new Date(`${iso.slice(0, 10)}T00:00:00Z`);
  return Number.isNaN(d.getTime()) ? iso : dateFmt.format(d);
}

export function formatDateTime(d: Date | string): string {
  const date = typeof d === "string" ? new Date(d) : d;
  return new Intl.DateTimeFormat("en-GB", { day: "numeric", month: "short", year: "numeric", hour: "2-digit", minute: "2-digit" }).format(date);
}

export function formatPercent(p: number | null | undefined, digits = 0): string {
  return p == null ? "—" : `${(p * 100).toFixed(digits)} %`;
}
