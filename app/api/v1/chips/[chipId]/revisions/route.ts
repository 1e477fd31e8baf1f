import { z } from "zod";
import { locateChip, listRevisions } from "@/db/queries/chips";
import { requireAccessTo } from "@/lib/auth/require";
import { revisionNoteSchema } from "@/lib/chips/schemas";
import { maxUploadBytes, requireChip, uploadRevision } from "@/lib/chips/service";
import { revisionView } from "@/lib/chips/views";
import { readUpload } from "@/lib/http/multipart";
import { DomainError } from "@/lib/errors";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ chipId: idParam });

/** GET /api/v1/chips/:chipId/revisions — the chip's revisions, newest first. */
export const GET = route({ params }, async ({ params }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "chip.view");
  const chip = await requireChip(ctx, params.chipId);
  return { revisions: (await listRevisions(ctx.scope, chip.id)).map(revisionView) };
});

/**
 * POST /api/v1/chips/:chipId/revisions — multipart upload: `file` (the .dxf), optional `note`.
 * 201 with the revision and its layer survey; 409 duplicate_revision when the same file is already a revision.
 */
export const POST = route({ params }, async ({ req, params }) => {
  const ctx = await requireAccessTo(() => locateChip(params.chipId), "revision.upload");
  const upload = await readUpload(req, maxUploadBytes());
  const note = revisionNoteSchema.safeParse(upload.fields.note ?? "");
  if (!note.success) throw new DomainError("invalid_input", `note: ${note.error.issues[0]?.message}`, 400);
  const { revision, survey } = await uploadRevision(ctx, params.chipId, { fileName: upload.fileName, bytes: upload.bytes, note: note.data });
  return Response.json({ revision: revisionView(revision), survey }, { status: 201 });
});
