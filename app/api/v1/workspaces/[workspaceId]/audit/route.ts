import { z } from "zod";
import { listAuditEvents } from "@/db/queries/audit";
import { requireMembership } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam });
const query = z.object({
  objectType: z.string().min(1).max(64).optional(),
  objectId: z.string().min(1).max(64).optional(),
  limit: z.coerce.number().int().min(1).max(1000).optional(),
});

/** GET /api/v1/workspaces/:workspaceId/audit — the workspace's audit events, newest first (admin). Read-only: no other method exists. */
export const GET = route({ params, query }, async ({ params, query }) => {
  const { scope } = await requireMembership(params.workspaceId, "workspace.manage");
  const events = await listAuditEvents(scope, query);
  return { events: events.map((e) => ({ ...e, at: e.at.toISOString() })) };
});
