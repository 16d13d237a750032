import { NextResponse } from "next/server";
import { handler, readJson, AppError } from "@/lib/server/errors";
import { attemptSignIn, clientAddress } from "@/lib/server/signin";
import { startSession } from "@/lib/server/auth";
import { signInSchema } from "@/lib/schemas";

export const POST = handler(async (req: Request) => {
  const body = await readJson(req, signInSchema);
  const result = await attemptSignIn({ ...body, address: clientAddress(req.headers) });
  if (!result.ok) throw new AppError(result.status === 429 ? "too_many" : "unauthorized", result.message);
  await startSession(result.userId);
  return NextResponse.json({ ok: true });
});
