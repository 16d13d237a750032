import { NextResponse } from "next/server";
import { handler } from "@/lib/server/errors";
import { loadSharedSearch } from "@/lib/server/shared";
import type { SharedSearchAnswer } from "@/lib/search-contract";

/** Public, read-only: the plan search a search link opens. Any other token (revoked, expired, another scope) is a plain 404. */
export const GET = handler(async (_req: Request, ctx: { params: Promise<{ token: string }> }) => {
  const { token } = await ctx.params;
  return NextResponse.json((await loadSharedSearch(token)) satisfies SharedSearchAnswer, { headers: { "cache-control": "no-store" } });
});
