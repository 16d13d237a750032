/** Wording of the invite page, shared by the page and its server actions. */
export const INVITE_PROBLEM = {
  unknown: "This invitation link is not valid. Check that you opened the whole link from the e-mail, or ask the project administrator for a new invitation.",
  used: "This invitation has already been used. If it was you, sign in to see the project.",
  expired: "This invitation has expired (invitations work for 7 days). Ask the project administrator to send a new one.",
  account_exists: "An account with this e-mail address already exists. Reload the page and sign in to accept the invitation.",
  wrong_account: "This invitation is for a different e-mail address than the account you are signed in with.",
} as const;
export type InviteProblem = keyof typeof INVITE_PROBLEM;
