import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { loadSharedScenario } from "@/lib/server/shared";

/** Public, read-only: what a share link shows. A revoked, expired or unknown token is a plain 404. */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ token: string }> }) => {
  const { token } = await ctx.params;
  return NextResponse.json(await loadSharedScenario(token));
});
