import { z } from "zod";
import { listMembers } from "@/db/queries/members";
import { requireMembership } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam });

/** GET /api/v1/workspaces/:workspaceId/members — members and their roles (any member). */
export const GET = route({ params }, async ({ params }) => {
  const { scope } = await requireMembership(params.workspaceId, "member.view");
  const members = await listMembers(scope);
  return { members: members.map((m) => ({ ...m, joinedAt: m.joinedAt.toISOString() })) };
});
