"use server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { endSession, startSession } from "@/lib/server/auth";
import { attemptSignIn, clientAddress } from "@/lib/server/signin";
import { signInSchema } from "@/lib/schemas";

export type SignInState = { error?: string; fields?: Record<string, string>; email?: string };

export async function signInAction(_prev: SignInState, form: FormData): Promise<SignInState> {
  const parsed = signInSchema.safeParse({ email: form.get("email"), password: form.get("password") });
  const email = String(form.get("email") ?? "");
  if (!parsed.success) {
    const fields: Record<string, string> = {};
    for (const i of parsed.error.issues) fields[String(i.path[0])] = i.message;
    return { error: "Check the highlighted fields.", fields, email };
  }
  const result = await attemptSignIn({ ...parsed.data, address: clientAddress(await headers()) });
  if (!result.ok) return { error: result.message, email };
  await startSession(result.userId);
  const next = z.string().regex(/^\/[a-zA-Z0-9/_-]*$/).safeParse(form.get("next"));
  redirect(next.success && next.data !== "/" ? next.data : "/projects");
}

export async function signOutAction() {
  await endSession();
  redirect("/signin");
}
