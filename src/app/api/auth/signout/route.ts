import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { endSession } from "@/lib/server/auth";

export const POST = handler(async () => {
  await endSession();
  return NextResponse.json({ ok: true });
});
