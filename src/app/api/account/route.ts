import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";
import { accountDetailsSchema } from "@/lib/schemas";
import { updateUserDetails } from "@db/queries/users";
import type { AccountDetailsAnswer } from "@/lib/account-contract";

/** The signed-in person's own name and title. */
export const PUT = handler(async (req: Request) => {
  const { user } = await requireUser();
  const body = await readJson(req, accountDetailsSchema, { maxBytes: 4 * 1024 });
  await updateUserDetails({ id: user.id, name: body.name, title: body.title });
  return NextResponse.json({ name: body.name, title: body.title } satisfies AccountDetailsAnswer);
});
