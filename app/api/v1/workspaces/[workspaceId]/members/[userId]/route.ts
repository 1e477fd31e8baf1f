import { z } from "zod";
import { changeMemberRoles, removeMember } from "@/lib/auth/members";
import { requireMembership } from "@/lib/auth/require";
import { memberRolesSchema } from "@/lib/auth/schemas";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam, userId: idParam });

/** PATCH /api/v1/workspaces/:workspaceId/members/:userId {roles} — replace a member's roles (admin). */
export const PATCH = route({ params, body: memberRolesSchema }, async ({ params, body }) => {
  const { scope } = await requireMembership(params.workspaceId, "workspace.manage");
  await changeMemberRoles(scope, params.userId, body.roles);
  return { ok: true, roles: body.roles };
});

/** DELETE /api/v1/workspaces/:workspaceId/members/:userId — remove a member (admin). */
export const DELETE = route({ params }, async ({ params }) => {
  const { scope } = await requireMembership(params.workspaceId, "workspace.manage");
  await removeMember(scope, params.userId);
  return { ok: true };
});
