import { z } from "zod";
import { requireMembership } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";
import { getMyEmailPreferences, saveMyEmailPreferences } from "@/lib/notifications/service";
import { emailPreferencesSchema } from "@/lib/review/schemas";

const query = z.object({ workspaceId: idParam });

/** GET /api/v1/notifications/preferences?workspaceId=… — which review e-mails you receive (in-app is always on). */
export const GET = route({ query }, async ({ query }) => {
  const ctx = await requireMembership(query.workspaceId, "workspace.view");
  return { email: await getMyEmailPreferences(ctx.scope) };
});

/** PUT …/preferences?workspaceId=… {review_requested?: bool, changes_requested?: bool, cleared?: bool, mentioned?: bool}. */
export const PUT = route({ query, body: emailPreferencesSchema }, async ({ query, body }) => {
  const ctx = await requireMembership(query.workspaceId, "workspace.view");
  await saveMyEmailPreferences(ctx.scope, body);
  return { email: await getMyEmailPreferences(ctx.scope) };
});
