import { z } from "zod";
import { listInvitations } from "@/db/queries/invitations";
import { inviteMember } from "@/lib/auth/invitations";
import { requireMembership } from "@/lib/auth/require";
import { inviteSchema } from "@/lib/auth/schemas";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam });

/** GET /api/v1/workspaces/:workspaceId/invitations — all invitations with status (admin). */
export const GET = route({ params }, async ({ params }) => {
  const { scope } = await requireMembership(params.workspaceId, "workspace.manage");
  const invitations = await listInvitations(scope);
  return { invitations: invitations.map((i) => ({ ...i, createdAt: i.createdAt.toISOString(), expiresAt: i.expiresAt.toISOString() })) };
});

/** POST /api/v1/workspaces/:workspaceId/invitations {email, roles} — invite by e-mail (admin). 201. */
export const POST = route({ params, body: inviteSchema }, async ({ params, body }) => {
  const { scope, user, workspace } = await requireMembership(params.workspaceId, "workspace.manage");
  const { invitationId } = await inviteMember(scope, { inviterName: user.name, workspaceName: workspace.name }, body);
  return Response.json({ invitation: { id: invitationId, email: body.email, roles: body.roles } }, { status: 201 });
});
