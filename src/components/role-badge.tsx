import { ROLE_LABELS, type ProjectRole } from "@/lib/permissions";

const TONE: Record<ProjectRole, string> = {
  admin: "bg-ink text-white",
  engineer: "bg-brand-100 text-brand-800",
  scheduler: "bg-brand-100 text-brand-800",
  inspector: "bg-warn-bg text-warn",
  viewer: "bg-paper text-muted border border-line",
};

export function RoleBadge({ role }: { role: ProjectRole }) {
  return (
    <span className={`badge ${TONE[role]}`} data-testid="role-badge">
      {ROLE_LABELS[role]}
    </span>
  );
}
