import { analyzeLayout } from "@/lib/analysis/analyze";
import { requireUser } from "@/lib/auth/require";
import { checkUpload, maxUploadBytes } from "@/lib/chips/service";
import { DomainError } from "@/lib/errors";
import { readUpload } from "@/lib/http/multipart";
import { route } from "@/lib/http/route";

/**
 * POST /api/v1/analyze — stateless: multipart `file` (DXF) and `conditions`
 * (a JSON document) in, the analyze document out. Nothing is stored.
 */
export const POST = route({}, async ({ req }) => {
  await requireUser();
  const upload = await readUpload(req, maxUploadBytes());
  checkUpload(upload.fileName, upload.bytes);
  let conditions: unknown = {};
  if (upload.fields.conditions !== undefined && upload.fields.conditions.trim() !== "") {
    try {
      conditions = JSON.parse(upload.fields.conditions);
    } catch {
      throw new DomainError("invalid_json", "The conditions field is not valid JSON. Check quotes, commas and brackets.", 400);
    }
  }
  return analyzeLayout(upload.bytes, conditions);
});
