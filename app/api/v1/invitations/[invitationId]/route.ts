import { z } from "zod";
import { getInvitationWorkspaceId } from "@/db/queries/invitations";
import { revokeInvitation } from "@/lib/auth/invitations";
import { requireAccessTo } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ invitationId: idParam });

/** DELETE /api/v1/invitations/:invitationId — revoke a pending invitation (admin of its workspace; others 403). */
export const DELETE = route({ params }, async ({ params }) => {
  const { scope } = await requireAccessTo(async () => {
    const workspaceId = await getInvitationWorkspaceId(params.invitationId);
    return workspaceId === null ? null : { workspaceId };
  }, "workspace.manage");
  await revokeInvitation(scope, params.invitationId);
  return { ok: true };
});
