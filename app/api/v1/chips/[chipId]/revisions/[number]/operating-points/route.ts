import { z } from "zod";
import { listAnalyses, locateChip } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { operatingPointFormSchema } from "@/lib/chips/schemas";
import { createOperatingPoint, requireRevision } from "@/lib/chips/service";
import { listWorkspaceFluidChoices } from "@/lib/chips/settings";
import { analysisListView } from "@/lib/chips/views";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ chipId: idParam, number: idParam });

/** GET …/operating-points — the revision's operating points with their analyses' summaries. */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "chip.view");
  const revision = await requireRevision(ctx, params.chipId, params.number);
  return { analyses: (await listAnalyses(ctx.scope, revision.id)).map(analysisListView) };
});

/**
 * POST …/operating-points — add an operating point and analyse it. 201 whether
 * the analysis succeeded or failed (the failure is stored and returned in plain words).
 */
export const POST = route({ params, body: operatingPointFormSchema }, async ({ params, body }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "operating_point.create");
  const result = await createOperatingPoint(ctx, params.chipId, params.number, body, await listWorkspaceFluidChoices(ctx.scope));
  return Response.json(
    { operating_point_id: result.operatingPointId, analysis_id: result.analysisId, status: result.status, error: result.error },
    { status: 201 },
  );
});
