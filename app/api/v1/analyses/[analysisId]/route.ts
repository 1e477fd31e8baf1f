import { z } from "zod";
import { getAnalysis, locateAnalysis } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { NotFoundError } from "@/lib/errors";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ analysisId: idParam });

/** GET /api/v1/analyses/:analysisId — the stored analysis: conditions and the full analyze document. */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(() => locateAnalysis(params.analysisId), "chip.view");
  const a = await getAnalysis(ctx.scope, params.analysisId);
  if (!a) throw new NotFoundError("That analysis does not exist.");
  return {
    id: a.id,
    revision_id: a.revisionId,
    operating_point: a.operatingPointName,
    conditions: a.conditions,
    status: a.status,
    error: a.status === "failed" ? { code: a.errorCode, message: a.errorMessage } : null,
    created_at: a.createdAt.toISOString(),
    result: a.result,
  };
});
