/**
 * The holiday trade-off in one table: for standing down and working through, the finish (P50/P80), the chance
 * of meeting the target, delay to drivers, the longest holiday backup, road-user and contract cost — and the
 * change each way — so the decision reads in one place.
 */
import type { HolidayTradeoff } from "@sim/tradeoff";
import { formatIsoDate, formatPercent } from "@/lib/format";

type Pair = { p50: number | null; p80: number | null };

const int = (v: number | null) => (v === null ? "—" : Math.round(v).toLocaleString("en-US"));
const usd = (v: number | null) => (v === null ? "—" : `${v < 0 ? "−" : ""}$${Math.round(Math.abs(v)).toLocaleString("en-US")}`);
const signed = (v: number | null, f: (x: number) => string) => (v === null ? "—" : v > 0 ? `+${f(v)}` : v < 0 ? `−${f(-v)}` : "no change");
const date = (d: string) => (d === "unfinished" ? "beyond the horizon" : formatIsoDate(d));
const pair = (p: Pair, f: (v: number | null) => string) => `${f(p.p50)} / ${f(p.p80)}`;

export function tradeoffRows(t: HolidayTradeoff): { label: string; standDown: string; workThrough: string; change: string }[] {
  const s = t.standDown;
  const w = t.workThrough;
  const rows = [
    {
      label: "Finish (P50 / P80)",
      standDown: `${date(s.finish.p50)} / ${date(s.finish.p80)}`,
      workThrough: `${date(w.finish.p50)} / ${date(w.finish.p80)}`,
      change: t.daysGained.p50 === null || t.daysGained.p80 === null ? "—" : `${t.daysGained.p50} / ${t.daysGained.p80} days sooner`,
    },
  ];
  if (s.targetProbability !== null && w.targetProbability !== null)
    rows.push({ label: "Chance of meeting the target", standDown: formatPercent(s.targetProbability), workThrough: formatPercent(w.targetProbability), change: signed(t.targetProbabilityChange === null ? null : Math.round(t.targetProbabilityChange * 100), (x) => `${x} points`) });
  if (t.hasTraffic) {
    rows.push({ label: "Delay to drivers, vehicle-hours (P50 / P80)", standDown: pair(s.delayVehHours, int), workThrough: pair(w.delayVehHours, int), change: `${signed(t.extraDelayVehHours.p50, (x) => int(x))} / ${signed(t.extraDelayVehHours.p80, (x) => int(x))}` });
    const hb = (p: { p50: number; p80: number } | null) => (p ? `${p.p50.toFixed(1)} / ${p.p80.toFixed(1)} mi` : "—");
    rows.push({
      label: "Longest holiday backup (P50 / P80)",
      standDown: hb(s.holidayBackupMiles),
      workThrough: hb(w.holidayBackupMiles),
      change: s.holidayBackupMiles && w.holidayBackupMiles ? `${signed(Math.round((w.holidayBackupMiles.p50 - s.holidayBackupMiles.p50) * 10) / 10, (x) => `${x.toFixed(1)} mi`)}` : "—",
    });
    rows.push({ label: "Road-user cost (P50 / P80)", standDown: pair(s.roadUserCost, usd), workThrough: pair(w.roadUserCost, usd), change: `${signed(t.extraRoadUserCost.p50, (x) => usd(x))} / ${signed(t.extraRoadUserCost.p80, (x) => usd(x))}` });
  }
  if (s.contractCost.p50 !== null || w.contractCost.p50 !== null)
    rows.push({ label: "Contract cost (P50 / P80)", standDown: pair(s.contractCost, usd), workThrough: pair(w.contractCost, usd), change: `${signed(t.extraContractCost.p50, (x) => usd(x))} / ${signed(t.extraContractCost.p80, (x) => usd(x))}` });
  return rows;
}

export function TradeoffTable({ t }: { t: HolidayTradeoff }) {
  return (
    // Left-aligned, padded cells with a rule under each row: the figures are pairs of dates and amounts, and
    // centred cells without padding ran "6 Jul 2027" into the next column's "21 Jun 2027".
    <table className="w-full max-w-4xl border-collapse text-sm" data-testid="tradeoff-table">
      <caption className="text-left text-sm text-muted">Standing down over holidays against working through them, on the same seeds</caption>
      <thead>
        <tr className="border-b border-line">
          {["What", "Stand down", "Work through", "Working through changes it by"].map((h) => (
            <th key={h} scope="col" className="py-1 pr-4 text-left align-bottom">
              {h}
            </th>
          ))}
        </tr>
      </thead>
      <tbody>
        {tradeoffRows(t).map((r) => (
          <tr key={r.label} className="border-b border-line/60 align-top">
            <th scope="row" className="py-1 pr-4 text-left">
              {r.label}
            </th>
            <td className="py-1 pr-4">{r.standDown}</td>
            <td className="py-1 pr-4">{r.workThrough}</td>
            <td className="py-1 pr-4">{r.change}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
