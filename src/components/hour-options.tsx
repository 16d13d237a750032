import { formatHour } from "@/lib/format";

/** The 24 whole hours of a day as a select's options, "00:00" to "23:00", valued 0–23. */
export function HourOptions() {
  return Array.from({ length: 24 }, (_, h) => (
    <option key={h} value={h}>
      {formatHour(h)}
    </option>
  ));
}
