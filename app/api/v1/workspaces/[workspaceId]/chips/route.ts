import { z } from "zod";
import { listChips } from "@/db/queries/chips";
import { requireMembership } from "@/lib/auth/require";
import { chipCreateSchema } from "@/lib/chips/schemas";
import { createChip } from "@/lib/chips/service";
import { chipListView, chipView } from "@/lib/chips/views";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ workspaceId: idParam });

/** GET /api/v1/workspaces/:workspaceId/chips — the workspace's chips with latest revision and worst flag. */
export const GET = route({ params }, async ({ params }) => {
  const { scope } = await requireMembership(params.workspaceId, "chip.view");
  return { chips: (await listChips(scope)).map(chipListView) };
});

/** POST /api/v1/workspaces/:workspaceId/chips — create a chip (designers). */
export const POST = route({ params, body: chipCreateSchema }, async ({ params, body }) => {
  const ctx = await requireMembership(params.workspaceId, "chip.create");
  const chip = await createChip(ctx, body);
  return Response.json({ chip: chipView(chip) }, { status: 201 });
});
