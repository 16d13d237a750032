import Link from "next/link";
import { redirect } from "next/navigation";
import { currentSession } from "@/lib/server/auth";
import { signOutAction } from "../(auth)/signin/actions";

export default async function AppLayout({ children }: { children: React.ReactNode }) {
  const s = await currentSession();
  if (!s) redirect("/signin");
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-3 focus:top-3 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b border-line bg-white">
        <div className="mx-auto flex max-w-7xl flex-wrap items-center justify-between gap-3 px-5 py-3">
          <div className="flex items-center gap-6">
            <Link href="/projects" className="text-lg font-bold tracking-tight text-brand-700">
              Pourline
            </Link>
            <nav aria-label="Main">
              <ul className="flex gap-4 text-sm">
                <li>
                  <Link href="/projects" className="text-muted hover:text-ink">
                    Projects
                  </Link>
                </li>
              </ul>
            </nav>
          </div>
          <div className="flex items-center gap-4 text-sm">
            <Link href="/account" className="text-right leading-tight hover:underline">
              <span className="sr-only">Your account: </span>
              <span className="block font-medium" data-testid="signed-in-name">
                {s.user.name}
              </span>
              <span className="block text-muted">{s.user.title || s.user.email}</span>
            </Link>
            <form action={signOutAction}>
              <button type="submit" className="btn-secondary">
                Sign out
              </button>
            </form>
          </div>
        </div>
      </header>
      <main id="main" className="mx-auto max-w-7xl px-5 py-6">
        {children}
      </main>
    </div>
  );
}
