import { z } from "zod";
import { listOutbox } from "@/db/queries/outbox";
import { requireMembership } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam });

/** GET /api/v1/workspaces/:workspaceId/outbox — mail stored by the local transport for this workspace (admin). */
export const GET = route({ params }, async ({ params }) => {
  const { scope } = await requireMembership(params.workspaceId, "mail.outbox.view");
  const messages = await listOutbox(scope);
  return { messages: messages.map((m) => ({ ...m, createdAt: m.createdAt.toISOString() })) };
});
