import "server-only";
/** Limits and wording of the password-reset flow, shared by its route handlers and pages. */
export const RESET_WINDOW_MS = 15 * 60 * 1000;
/** Requests per e-mail address and per client address in the window; counted whether or not the account exists. */
export const MAX_RESETS_PER_ACCOUNT = 3;
export const MAX_RESETS_PER_ADDRESS = 20;
export const RESET_LINK_MS = 60 * 60 * 1000;

export const RESET_REQUESTED =
  "If a Pourline account uses that e-mail address, we have sent it a link to choose a new password. The link works once, for one hour.";
export const RESET_TOO_MANY = "Too many reset requests. Wait 15 minutes and try again.";

export const RESET_LINK_PROBLEM = {
  unknown: "This reset link is not valid. Ask for a new one from the sign-in page.",
  used: "This reset link has already been used. Ask for a new one from the sign-in page.",
  expired: "This reset link has expired (links work for one hour). Ask for a new one from the sign-in page.",
} as const;
