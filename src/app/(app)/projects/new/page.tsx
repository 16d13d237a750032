import type { Metadata } from "next";
import { pageUser } from "@/lib/server/page-access";
import { Breadcrumb } from "@/components/breadcrumb";
import { ProjectDetailsForm } from "@/components/project-details-form";

export const metadata: Metadata = { title: "New project" };

/** Anyone signed in may start a project; they become its administrator (`POST /api/projects`). */
export default async function NewProjectPage() {
  await pageUser();
  return (
    <div className="mx-auto max-w-2xl space-y-5">
      <Breadcrumb here="New project" />
      <div>
        <h1>New project</h1>
        <p className="mt-1 text-sm text-muted">
          One structure and its deck. You become the project&apos;s administrator: you add the engineers, schedulers, inspectors and viewers, and
          every scenario on it starts from this deck.
        </p>
      </div>
      <ProjectDetailsForm />
    </div>
  );
}
