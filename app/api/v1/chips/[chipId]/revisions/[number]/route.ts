import { z } from "zod";
import { getLayerMap, listAnalyses, locateChip } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { requireRevision } from "@/lib/chips/service";
import { analysisListView, revisionView } from "@/lib/chips/views";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ chipId: idParam, number: idParam });

/** GET /api/v1/chips/:chipId/revisions/:number — the revision, its layer map and its analyses. */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "chip.view");
  const revision = await requireRevision(ctx, params.chipId, params.number);
  return {
    revision: revisionView(revision),
    layer_map: await getLayerMap(ctx.scope, revision.id),
    analyses: (await listAnalyses(ctx.scope, revision.id)).map(analysisListView),
  };
});
