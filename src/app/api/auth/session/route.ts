import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";

export const GET = handler(async () => {
  const { user } = await requireUser();
  return NextResponse.json({ user: { id: user.id, email: user.email, name: user.name, title: user.title } });
});
