import Link from "next/link";
import { formatIsoDate, formatStation } from "@/lib/format";

/**
 * The columns that say which shift a row is — date, shift, operation, stations, crew — for the log and its deleted
 * shifts alike. The data- marks are for a phone, where the row is read as a card (globals.css `stack-on-phone`).
 */
export function ShiftHeads({ date = true }: { date?: boolean } = {}) {
  return (
    <>
      {date && <th scope="col" className="py-2 pr-3">Date</th>}
      <th scope="col" className="py-2 pr-3">Shift</th>
      <th scope="col" className="py-2 pr-3">Operation</th>
      <th scope="col" className="py-2 pr-3">Stations</th>
      <th scope="col" className="py-2 pr-3">Crew</th>
    </>
  );
}

/**
 * `dayHref`: the date links to that day's report (the log's rows; a deleted shift is in no report). `date: false`:
 * a day's report, whose rows are all of one day.
 */
export function ShiftCells(props: {
  date?: boolean;
  e: { workDate: string; shift: string; operationId: string; fromStationFt: number; toStationFt: number; crew: string };
  shiftName: (id: string) => string;
  names: Record<string, string>;
  dayHref?: (day: string) => string;
}) {
  const { e, shiftName, names, dayHref, date = true } = props;
  return (
    <>
      {date && (
        <td className="py-2 pr-3 whitespace-nowrap" data-inline>
          {dayHref ? (
            <Link href={dayHref(e.workDate)} className="text-brand-700 hover:underline" title="This day's report">
              {formatIsoDate(e.workDate)}
            </Link>
          ) : (
            formatIsoDate(e.workDate)
          )}
        </td>
      )}
      <td className="py-2 pr-3" data-inline>
        {shiftName(e.shift)}
      </td>
      <td className="py-2 pr-3" data-inline>
        {names[e.operationId] ?? e.operationId}
      </td>
      <td className="py-2 pr-3 whitespace-nowrap" data-inline>
        {formatStation(e.fromStationFt)} – {formatStation(e.toStationFt)}
      </td>
      <td className="py-2 pr-3" data-label="Crew" data-empty={e.crew ? undefined : true}>
        {e.crew || "—"}
      </td>
    </>
  );
}

/** The weather seen and the hours lost, for the log and a day's report alike (each named, or left out, on a phone). */
export function WeatherAndLostCells({ e }: { e: { tempF: number | null; rain: boolean; lostHours: number; lostReason: string } }) {
  return (
    <>
      <td className="py-2 pr-3" data-label="Weather" data-empty={e.tempF === null && !e.rain ? true : undefined}>
        {e.tempF === null ? "—" : `${e.tempF} °F`}
        {e.rain ? ", rain" : ""}
      </td>
      <td className="py-2 pr-3" data-label="Lost" data-empty={e.lostHours > 0 ? undefined : true}>
        {e.lostHours > 0 ? `${e.lostHours} h (${e.lostReason})` : "—"}
      </td>
    </>
  );
}
