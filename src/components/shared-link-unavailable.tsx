/** What every share link answers when it is unknown, expired or revoked: the same words, so nothing hints which it was. */
export function SharedLinkUnavailable() {
  return (
    <main id="main" className="mx-auto max-w-xl px-5 py-16 text-center">
      <p className="text-lg font-bold tracking-tight text-brand-700">Pourline</p>
      <div className="card mt-6" data-testid="shared-not-found">
        <h1>This link is not available</h1>
        <p className="mt-2 text-sm text-muted">It does not exist, has expired or was revoked. Ask the person who shared it for a new link.</p>
      </div>
    </main>
  );
}
