import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { currentSession } from "@/lib/server/auth";
import { SignInForm } from "./signin-form";
import { SafetyNote } from "@/components/safety-note";

export const metadata: Metadata = { title: "Sign in" };

export default async function SignInPage({ searchParams }: { searchParams: Promise<{ next?: string }> }) {
  if (await currentSession()) redirect("/projects");
  const { next } = await searchParams;
  return (
    <main className="mx-auto flex min-h-screen max-w-5xl flex-col justify-center gap-10 px-6 py-12 md:flex-row md:items-center">
      <section className="md:w-1/2">
        <p className="text-sm font-semibold uppercase tracking-widest text-brand-600">Pourline</p>
        <h1 className="mt-2 text-3xl">Deck overlay plans you can stand behind.</h1>
        <p className="mt-4 text-muted">
          Sequence the crews along the stationing, fit them into lane-closure windows and the weather, and tell the
          owner how likely the finish date is.
        </p>
        <div className="mt-6">
          <SafetyNote compact />
        </div>
      </section>
      <section className="card md:w-1/2" aria-labelledby="signin-heading">
        <h2 id="signin-heading">Sign in</h2>
        <SignInForm next={next ?? ""} />
        <p className="mt-4 text-sm">
          <Link href="/reset" className="text-brand-700 underline">
            Forgot your password?
          </Link>
        </p>
      </section>
    </main>
  );
}
