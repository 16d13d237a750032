/**
 * Where a page sits: Projects / project / here. One component so every page starts the trail at Projects (two
 * pages began at the project and read as if there were nothing above it).
 */
import Link from "next/link";

export function Breadcrumb({ project, here }: { project?: { id: string; name: string }; here: string }) {
  return (
    <nav aria-label="Breadcrumb" className="text-sm text-muted">
      <Link href="/projects" className="hover:text-ink">
        Projects
      </Link>{" "}
      /{" "}
      {project && (
        <>
          <Link href={`/projects/${project.id}`} className="hover:text-ink">
            {project.name}
          </Link>{" "}
          /{" "}
        </>
      )}
      <span className="text-ink" aria-current="page">
        {here}
      </span>
    </nav>
  );
}
