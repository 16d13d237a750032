/**
 * The queue hour by hour along a stored closure timeline (the representative iteration's
 * `closureTimeline`, local ISO periods), for the public travel advisory. Contract: the same D/D/1 over the
 * same capacity pieces as the engine (MODEL.md, "Traffic": capacity of the set of closures standing, from
 * ./traffic-capacity; the queue grows at demand − capacity, a queue left when every lane reopens discharges at
 * the open-road rate, no closure and no queue adds nothing), so each day's largest hourly value equals the
 * day's longest queue of the run summary. Out: per day since startDate, the longest queue (miles, over the
 * directions) within each clock hour, and the longest delay of the vehicle at the end of a queue (minutes,
 * ./queue-limit: queue / the rate it is served at). Pure; it reads a stored run and simulates nothing.
 */
import { parseIsoDate } from "./dates";
import type { Scenario } from "./schema";
import { resolveStages } from "./stages";
import { compileTraffic, queuePiece, type QueuePiece } from "./traffic";
import { capacityOf } from "./traffic-capacity";
import { lastVehicleDelayMinutes } from "./queue-limit";

export interface StoredPeriod {
  closure: string;
  start: string;
  end: string;
}

export interface HourlyQueues {
  /** Day index since startDate of miles[0]. */
  firstDay: number;
  /** miles[d][h]: longest queue in clock hour h of day firstDay + d, miles (max over directions). */
  miles: Float64Array[];
  /** vehicles[d][h] of the direction with the longest queue that hour. */
  vehicles: Float64Array[];
  /** minutes[d][h]: longest delay of the last vehicle in a queue in that hour, minutes (max over directions). */
  minutes: Float64Array[];
}

const hoursOf = (day0: number, iso: string) => 24 * (parseIsoDate(iso.slice(0, 10)) - day0) + Number(iso.slice(11, 13)) + Number(iso.slice(14, 16)) / 60;

/** Null without a traffic section, a direction or a period. */
export function hourlyQueues(s: Scenario, periods: StoredPeriod[]): HourlyQueues | null {
  const day0 = parseIsoDate(s.startDate);
  const ids = [...s.calendar.closures.map((c) => c.id), ...resolveStages(s).map((st) => `stage:${st.id}`)];
  const spans = periods
    .map((p) => ({ j: ids.indexOf(p.closure), a: hoursOf(day0, p.start), b: hoursOf(day0, p.end) }))
    .filter((p) => p.j >= 0 && p.b > p.a);
  if (spans.length === 0) return null;
  const lastHour = Math.max(...spans.map((p) => p.b));
  const firstDay = Math.floor(Math.min(...spans.map((p) => p.a)) / 24);
  // Room after the last closure for a queue to clear (two days is far more than any queue takes to clear).
  const days = Math.ceil(lastHour / 24) + 2;
  const m = compileTraffic(s, day0, days);
  if (!m) return null;
  const nDays = days - firstDay;
  const miles = Array.from({ length: nDays }, () => new Float64Array(24));
  const vehicles = Array.from({ length: nDays }, () => new Float64Array(24));
  const minutes = Array.from({ length: nDays }, () => new Float64Array(24));
  const piece: QueuePiece = { queue: 0, delay: 0, clearsAfter: -1 };

  for (const dir of m.directions) {
    const mine = spans.filter((p) => (dir.select >> p.j) & 1);
    if (mine.length === 0) continue;
    const cuts = [...new Set(mine.flatMap((p) => [p.a, p.b]))].sort((x, y) => x - y);
    const toMiles = (veh: number) => (veh * dir.pcPerVeh) / (m.jamDensity * dir.storageLanes);
    let q = 0;
    const note = (t: number, veh: number, served: number) => {
      const d = Math.floor(t / 24) - firstDay;
      const h = Math.floor(t) % 24;
      if (d < 0 || d >= nDays) return;
      const wait = lastVehicleDelayMinutes(veh, served);
      if (wait > minutes[d][h]) minutes[d][h] = wait;
      const mi = toMiles(veh);
      if (mi > miles[d][h]) {
        miles[d][h] = mi;
        vehicles[d][h] = veh;
      }
    };
    // Walk each elementary piece between cuts (closures standing: constant set), then open road to the next cut.
    for (let k = 0; k < cuts.length; k++) {
      const a = cuts[k];
      const b = k + 1 < cuts.length ? cuts[k + 1] : 24 * days;
      let set = 0;
      for (const p of mine) if (p.a <= a && a < p.b) set |= 1 << p.j;
      const cap = set ? capacityOf(m, dir, set) : dir.openCapacity;
      const narrowed = set !== 0 && cap < Infinity;
      let t = a;
      while (t < b && t < 24 * days) {
        if (!narrowed && q <= 0) break; // open road, no queue: nothing to add until the next closure
        const hb = Math.min(Math.floor(t) + 1, b);
        const q0 = q;
        const served = narrowed ? cap : dir.openCapacity;
        queuePiece(q, dir.hourDemand[Math.floor(t)], served, hb - t, piece);
        q = piece.queue;
        if (q0 > 0 || q > 0) note(t, Math.max(q0, q), served);
        t = hb;
      }
    }
  }
  return { firstDay, miles, vehicles, minutes };
}
