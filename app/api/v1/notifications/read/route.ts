import { z } from "zod";
import { requireMembership } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";
import { markRead } from "@/lib/notifications/service";
import { markReadSchema } from "@/lib/review/schemas";

const query = z.object({ workspaceId: idParam });

/** POST /api/v1/notifications/read?workspaceId=… {ids?: number[]} — mark your notifications read (all when ids is absent). */
export const POST = route({ query, body: markReadSchema }, async ({ query, body }) => {
  const ctx = await requireMembership(query.workspaceId, "workspace.view");
  return { marked: await markRead(ctx.scope, body.ids ?? null) };
});
