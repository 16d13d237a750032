/**
 * What the look-ahead routes answer, for the week-ahead page and the server that builds the answers:
 * - `GET /api/scenarios/:id/look-ahead` → `LookAheadBoard`: the next 7 days × shifts × weather-gated operations,
 *   judged on the project's cached forecast (`scenarioLookAhead`, src/lib/server/look-ahead.ts, which the daily
 *   e-mail reads too). Without a forecast the board still comes, its cells "cannot tell" and `forecast` says why;
 * - `GET` and `PUT /api/scenarios/:id/look-ahead/notice` → `LookAheadNoticeAnswer`: the daily e-mail of the board,
 *   `notice: null` until someone sets it up.
 * Times are ISO strings: what the JSON carries.
 */
import type { LookAheadDay, NextOpenTime } from "@sim/lookahead";

/** Fresh; stale (the last refresh failed, or it is overdue); none yet; or no location to ask a forecast for. */
export type ForecastStatus = "fresh" | "stale" | "none" | "noLocation";

export interface LookAheadBoard {
  today: string;
  timeZone: string;
  rainRule: string;
  forecast: {
    status: ForecastStatus;
    /** Whose forecast, in words, for "Forecast … from <source>". */
    source: string;
    message: string | null;
    fetchedAt: string | null;
    ageMinutes: number | null;
    place: string | null;
    office: string | null;
    generatedAt: string | null;
    firstHour: string | null;
    lastHour: string | null;
    gaps: Record<string, number> | null;
  };
  days: LookAheadDay[];
  /** When every cell of the week is closed (winter, a plan not started yet): the plan's next open time, else null. */
  nextOpen: NextOpenTime | null;
}

export interface LookAheadNotice {
  enabled: boolean;
  /** The local hour it is sent after, in the scenario's time zone. */
  hour: number;
  recipients: string[];
  /** The local date it was last sent for. */
  lastSentOn: string | null;
  updatedAt: string;
}

export interface LookAheadNoticeAnswer {
  notice: LookAheadNotice | null;
}
