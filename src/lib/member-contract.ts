/**
 * What a project's membership routes answer, for the Members page and the handlers that build them:
 * - `GET /api/projects/:id/members` → `MembersAnswer`: everyone on the project with their role, by name;
 * - `GET /api/projects/:id/invitations` → `InvitationsAnswer`: invitations not yet used and not expired, newest first;
 * - `POST /api/projects/:id/invitations` → `InvitationCreatedAnswer` (201). The token travels only in the e-mail,
 *   so no answer carries it.
 * Times are ISO strings: what the JSON carries.
 */
import type { ProjectRole } from "./permissions";

export interface MemberRow {
  userId: string;
  email: string;
  name: string;
  title: string;
  role: ProjectRole;
  addedAt: string;
}

export interface MembersAnswer {
  members: MemberRow[];
}

export interface InvitationCreatedAnswer {
  id: string;
  email: string;
  role: ProjectRole;
  expiresAt: string;
  createdAt: string;
}

export interface PendingInvitation extends InvitationCreatedAnswer {
  invitedByName: string;
}

export interface InvitationsAnswer {
  invitations: PendingInvitation[];
}
