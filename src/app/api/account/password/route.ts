import { NextResponse } from "next/server";
import { AppError, badRequest, handler, readJson } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";
import { startSession } from "@/lib/server/auth";
import { hashPassword } from "@/lib/server/password";
import { checkOwnPassword, OWN_PASSWORD_LOCKED, OWN_PASSWORD_WRONG } from "@/lib/server/signin";
import { passwordChangeSchema } from "@/lib/schemas";
import { changePasswordEndingSessions } from "@db/queries/users";

/**
 * Changes the signed-in person's password after checking the current one; every session of the account ends
 * (someone else's included) and this browser is signed in again with a new one.
 */
export const PUT = handler(async (req: Request) => {
  const { user } = await requireUser();
  const body = await readJson(req, passwordChangeSchema, { maxBytes: 4 * 1024 });
  const check = await checkOwnPassword({ email: user.email, password: body.currentPassword });
  if (check === "locked") throw new AppError("too_many", OWN_PASSWORD_LOCKED);
  if (check === "wrong") throw badRequest([{ path: "currentPassword", message: OWN_PASSWORD_WRONG }], "The current password is wrong; nothing was changed.");
  await changePasswordEndingSessions({ id: user.id, passwordHash: await hashPassword(body.newPassword) });
  await startSession(user.id);
  return NextResponse.json({ ok: true });
});
