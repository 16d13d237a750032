import Link from "next/link";
import { ACTIONS, ROLE_LABELS, type Action, type ProjectRole } from "@/lib/permissions";

/** What each permission lets a person do, in the words the screens use. */
const ACTION_WORDS: Record<Action, string> = {
  read: "read plans, outlooks and the field log, and compare scenarios",
  editScenario: "edit plans, upload field data and create scenarios",
  runScenario: "run forecasts",
  shareScenario: "share scenarios and publish closure notices",
  manageMembers: "manage members and invitations",
  recordProgress: "record shifts in the field log",
  editProject: "edit the project's details and its location for the weather forecast",
  archiveProject: "archive the project and restore it",
};

/**
 * The page a member sees where their role may not go (answered with 403): it says so and what each role may
 * do, instead of "not found", which would suggest the thing is gone. Non-members still get 404.
 */
export function RoleRefusal({ pageHeading = false }: { pageHeading?: boolean }) {
  const roles = Object.keys(ROLE_LABELS) as ProjectRole[];
  // Inside a scenario the page already has its heading (the scenario's name); elsewhere this is the page's own.
  const Heading = pageHeading ? "h1" : "h2";
  return (
    <section className="card max-w-2xl" data-testid="role-refusal" aria-labelledby="role-refusal-heading">
      <Heading id="role-refusal-heading" className={pageHeading ? "text-xl" : undefined}>
        Your role on this project cannot do this
      </Heading>
      <p className="mt-2 text-sm">
        This page is for roles that may change or share the project. Your role (on the project list, and beside each scenario&apos;s name) can
        still open everything it may read. If you need this page, ask the project&apos;s administrator to change your role.
      </p>
      <table className="mt-4 w-full border-collapse text-sm">
        <caption className="sr-only">What each role may do</caption>
        <thead>
          <tr>
            <th className="table-head">Role</th>
            <th className="table-head">May</th>
          </tr>
        </thead>
        <tbody>
          {roles.map((r) => (
            <tr key={r}>
              <th scope="row" className="table-cell text-left font-medium">
                {ROLE_LABELS[r]}
              </th>
              <td className="table-cell">
                {(Object.keys(ACTIONS) as Action[])
                  .filter((a) => (ACTIONS[a] as readonly string[]).includes(r))
                  .map((a) => ACTION_WORDS[a])
                  .join("; ")}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
      <p className="mt-4 text-sm">
        <Link href="/projects" className="text-brand-700 underline">
          Back to your projects
        </Link>
      </p>
    </section>
  );
}
