import { z } from "zod";
import { locateChip } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { readRevisionFile, requireRevision } from "@/lib/chips/service";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ chipId: idParam, number: idParam });

/** GET /api/v1/chips/:chipId/revisions/:number/file — the uploaded DXF, byte for byte. */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "chip.view");
  const revision = await requireRevision(ctx, params.chipId, params.number);
  const bytes = await readRevisionFile(revision.storageKey);
  return new Response(new Uint8Array(bytes), {
    headers: {
      "content-type": "application/dxf",
      "content-disposition": `attachment; filename="${revision.fileName.replace(/["\\\r\n]/g, "_")}"`,
      "x-content-sha256": revision.sha256,
    },
  });
});
