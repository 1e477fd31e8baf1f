import { z } from "zod";
import { locateChip } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { layerMapSchema } from "@/lib/chips/schemas";
import { saveLayerMap } from "@/lib/chips/service";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ chipId: idParam, number: idParam });

/** PUT /api/v1/chips/:chipId/revisions/:number/layer-map — how to read the layers (once per revision). */
export const PUT = route({ params, body: layerMapSchema }, async ({ params, body }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "revision.upload");
  await saveLayerMap(ctx, params.chipId, params.number, body);
  return Response.json({ layer_map: body }, { status: 201 });
});
