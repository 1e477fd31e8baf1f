import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { requireUser } from "@/lib/auth/require";
import { route } from "@/lib/http/route";

/** GET /api/v1/me — the signed-in user and their workspaces with roles. */
export const GET = route({}, async () => {
  const user = await requireUser();
  const workspaces = await listWorkspacesForUser(user.id);
  return { user, workspaces };
});
