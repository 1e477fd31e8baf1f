import { z } from "zod";
import { requireAccessTo } from "@/lib/auth/require";
import { route } from "@/lib/http/route";
import { locateFor, revisionParams } from "@/lib/review/routes";
import { auditToCsv, auditToJson, listRevisionAudit } from "@/lib/review/service";

const query = z.object({ format: z.enum(["json", "csv"], { message: "format is json or csv." }).default("json") });

/**
 * GET /api/v1/revisions/{revisionId}/audit?format=json|csv — every audit event of the revision, oldest first.
 * Read-only by design: no route edits or deletes audit events, and the database refuses both.
 */
export const GET = route({ params: revisionParams, query }, async ({ params, query }) => {
  const ctx = await requireAccessTo(locateFor(params.revisionId, false), "chip.view");
  const events = await listRevisionAudit(ctx, params.revisionId);
  const name = `revision-${params.revisionId}-audit`;
  if (query.format === "csv") {
    return new Response(auditToCsv(events), {
      headers: { "content-type": "text/csv; charset=utf-8; header=present", "content-disposition": `attachment; filename="${name}.csv"` },
    });
  }
  return Response.json({ revision_id: params.revisionId, events: auditToJson(events) }, { headers: { "content-disposition": `inline; filename="${name}.json"` } });
});
