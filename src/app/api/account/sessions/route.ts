import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";
import { startSession } from "@/lib/server/auth";
import { endAllSessions } from "@db/queries/users";
import type { SessionsEndedAnswer } from "@/lib/account-contract";

/** Signs the person out everywhere else: every session of the account ends, and this browser gets a new one. */
export const DELETE = handler(async () => {
  const { user } = await requireUser();
  const ended = await endAllSessions({ id: user.id });
  await startSession(user.id);
  return NextResponse.json({ endedElsewhere: Math.max(0, ended - 1) } satisfies SessionsEndedAnswer);
});
