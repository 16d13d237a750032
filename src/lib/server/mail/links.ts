import "server-only";
/** Absolute links for e-mails: APP_BASE_URL when set (npm start / npm test set it), else the request's origin. */
export function appBaseUrl(req: Request): string {
  const base = process.env.APP_BASE_URL || new URL(req.url).origin;
  return base.replace(/\/+$/, "");
}
