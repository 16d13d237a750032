/**
 * Runs once per server process. Starts the e-mail outbox poller, the plan-of-record forecast e-mails, the daily
 * re-forecast of plans of record, the weekly closure e-mails and the daily look-ahead notices in the Node.js runtime, unless
 * POURLINE_OUTBOX=off, there is no database configured, or this is the build.
 */
export async function register() {
  if (process.env.NEXT_RUNTIME !== "nodejs") return;
  if (process.env.POURLINE_OUTBOX === "off" || !process.env.DATABASE_URL) return;
  if (process.env.NEXT_PHASE === "phase-production-build") return;
  const { startOutboxPoller } = await import("./lib/server/mail/poller");
  startOutboxPoller();
  if (process.env.POURLINE_FORECAST_ALERTS !== "off") {
    const { startForecastAlertPoller } = await import("./lib/server/forecast-alerts");
    startForecastAlertPoller();
  }
  if (process.env.POURLINE_DAILY_REFORECAST !== "off") {
    const { startDailyReforecastPoller } = await import("./lib/server/daily-reforecast");
    startDailyReforecastPoller();
  }
  if (process.env.POURLINE_CLOSURE_WEEKLY !== "off") {
    const { startClosureWeeklyPoller } = await import("./lib/server/closure-weekly");
    startClosureWeeklyPoller();
  }
  if (process.env.POURLINE_LOOKAHEAD_NOTICES === "off") return;
  const { startLookAheadNoticePoller } = await import("./lib/server/look-ahead-notices");
  startLookAheadNoticePoller();
}
