/** The publish button's words: how many people it e-mails, or that it e-mails nobody (a bare "notify 2…" read as a misprint). */
export function publishLabel(subscribers: number): string {
  if (subscribers === 0) return "Publish closures (no one to notify)…";
  return `Publish closures and notify ${subscribers} subscriber${subscribers === 1 ? "" : "s"}…`;
}
