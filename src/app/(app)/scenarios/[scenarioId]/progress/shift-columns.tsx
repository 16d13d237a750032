import Link from "next/link";
import { formatIsoDate, formatStation } from "@/lib/format";

/** The columns that say which shift a row is — date, shift, operation, stations, crew — for the log and its deleted shifts alike. */
export function ShiftHeads() {
  return (
    <>
      <th scope="col" className="py-2 pr-3">Date</th>
      <th scope="col" className="py-2 pr-3">Shift</th>
      <th scope="col" className="py-2 pr-3">Operation</th>
      <th scope="col" className="py-2 pr-3">Stations</th>
      <th scope="col" className="py-2 pr-3">Crew</th>
    </>
  );
}

/** `dayHref`: the date links to that day's report (the log's rows; a deleted shift is in no report). */
export function ShiftCells(props: {
  e: { workDate: string; shift: string; operationId: string; fromStationFt: number; toStationFt: number; crew: string };
  shiftName: (id: string) => string;
  names: Record<string, string>;
  dayHref?: (day: string) => string;
}) {
  const { e, shiftName, names, dayHref } = props;
  return (
    <>
      <td className="py-2 pr-3 whitespace-nowrap">
        {dayHref ? (
          <Link href={dayHref(e.workDate)} className="text-brand-700 hover:underline" title="This day's report">
            {formatIsoDate(e.workDate)}
          </Link>
        ) : (
          formatIsoDate(e.workDate)
        )}
      </td>
      <td className="py-2 pr-3">{shiftName(e.shift)}</td>
      <td className="py-2 pr-3">{names[e.operationId] ?? e.operationId}</td>
      <td className="py-2 pr-3 whitespace-nowrap">
        {formatStation(e.fromStationFt)} – {formatStation(e.toStationFt)}
      </td>
      <td className="py-2 pr-3">{e.crew || "—"}</td>
    </>
  );
}
