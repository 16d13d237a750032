import type { Metadata } from "next";
import Link from "next/link";
import { RequestResetForm } from "./request-reset-form";

export const metadata: Metadata = { title: "Reset your password" };

export default function RequestResetPage() {
  return (
    <main className="mx-auto flex min-h-screen max-w-lg flex-col justify-center px-6 py-12">
      <p className="text-sm font-semibold uppercase tracking-widest text-brand-600">Pourline</p>
      <section className="card mt-3" aria-labelledby="reset-heading">
        <h1 id="reset-heading" className="text-xl">
          Reset your password
        </h1>
        <p className="mt-2 text-sm text-muted">Enter the e-mail address of your account. We will send it a link to choose a new password.</p>
        <RequestResetForm />
        <p className="mt-4 text-sm">
          <Link href="/signin" className="text-brand-700 underline">
            Back to sign in
          </Link>
        </p>
      </section>
    </main>
  );
}
