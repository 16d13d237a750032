import { RoleRefusal } from "@/components/role-refusal";

/** Shown (with 403) when a member's role may not open a page here; see src/lib/server/page-access.ts. */
export default function Forbidden() {
  return <RoleRefusal pageHeading />;
}
