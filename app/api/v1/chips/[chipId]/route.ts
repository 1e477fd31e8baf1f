import { z } from "zod";
import { locateChip, listRevisions } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { requireChip } from "@/lib/chips/service";
import { chipView, revisionView } from "@/lib/chips/views";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ chipId: idParam });

/** GET /api/v1/chips/:chipId — the chip and its revision history, newest first. */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "chip.view");
  const chip = await requireChip(ctx, params.chipId);
  return { chip: chipView(chip), revisions: (await listRevisions(ctx.scope, chip.id)).map(revisionView) };
});
