import { NextResponse } from "next/server";
import { handler, readJson } from "@/lib/server/errors";
import { requireProject } from "@/lib/server/access";
import { closureSubscriberSchema } from "@/lib/schemas";
import { addClosureSubscriber, listClosureSubscribers } from "@db/queries/closure-notices";
import type { ClosureSubscribersAnswer } from "@/lib/closure-notice-contract";

type Ctx = { params: Promise<{ projectId: string }> };

// Subscribers' addresses are personal data: only the people who publish closures see and change the list.
export const GET = handler(async (_req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  await requireProject(projectId, "shareScenario", "look");
  const subscribers = (await listClosureSubscribers({ projectId })).map((s) => ({ ...s, createdAt: s.createdAt.toISOString() }));
  return NextResponse.json({ subscribers } satisfies ClosureSubscribersAnswer);
});

export const POST = handler(async (req: Request, ctx: Ctx) => {
  const { projectId } = await ctx.params;
  const { user } = await requireProject(projectId, "shareScenario");
  const body = await readJson(req, closureSubscriberSchema);
  await addClosureSubscriber({ projectId, email: body.email, label: body.label, userId: user.id });
  return NextResponse.json({ ok: true }, { status: 201 });
});
