import { z } from "zod";
import { requireMembership } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";
import { countUnread, listInbox } from "@/lib/notifications/service";

const query = z.object({ workspaceId: idParam, unread: z.enum(["1", "0", "true", "false"]).optional() });

/** GET /api/v1/notifications?workspaceId=…[&unread=1] — your in-app inbox in that workspace, newest first. */
export const GET = route({ query }, async ({ query }) => {
  const ctx = await requireMembership(query.workspaceId, "workspace.view");
  const unreadOnly = query.unread === "1" || query.unread === "true";
  const [items, unread] = await Promise.all([listInbox(ctx.scope, { unreadOnly }), countUnread(ctx.scope)]);
  return {
    unread,
    notifications: items.map((n) => ({
      id: n.id,
      kind: n.kind,
      summary: n.summary,
      revision_id: n.revisionId,
      chip_id: n.chipId,
      revision_number: n.revisionNumber,
      actor: n.actorName,
      created_at: n.createdAt.toISOString(),
      read_at: n.readAt?.toISOString() ?? null,
    })),
  };
});
