import { z } from "zod";
import { locateShareLink } from "@/db/queries/reports";
import { requireAccessTo } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";
import { revokeShareLink } from "@/lib/reports/share";

const params = z.object({ id: idParam });

/** DELETE /api/v1/share-links/{id} — revokes the link at once (idempotent); the row stays on record. */
export const DELETE = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(async () => {
    const found = await locateShareLink(params.id);
    return found ? { workspaceId: found.workspaceId } : null;
  }, "report.share");
  return { share_link: await revokeShareLink(ctx, params.id) };
});
