import { handler } from "@/lib/server/errors";
import { requireUser } from "@/lib/server/access";
import { answerResponse } from "@/lib/server/http-cache";
import { runAnswer } from "@/lib/server/read-answers";

/** A run with its full results (src/lib/server/read-answers.ts; served beside Next by scripts/serve.mjs). */
export const GET = handler(async (req: Request, ctx: { params: Promise<{ runId: string }> }) => {
  const { runId } = await ctx.params;
  return answerResponse(await runAnswer(req, runId, await requireUser()));
});
