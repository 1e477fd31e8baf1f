import "server-only";
/**
 * Reads a multipart/form-data upload (one file field plus text fields) with
 * the platform's Request.formData(), refusing oversize bodies from their
 * declared length before anything is buffered.
 */
import { DomainError } from "@/lib/errors";

export type Upload = { fileName: string; bytes: Uint8Array; fields: Record<string, string> };

/** @throws DomainError 415 not multipart, 413 too large, 400 no file in `fileField`. */
export async function readUpload(req: Request, maxBytes: number, fileField = "file"): Promise<Upload> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^multipart\/form-data/i.test(type)) {
    throw new DomainError("unsupported_media_type", `Send the layout as multipart/form-data with the file in a field named “${fileField}”.`, 415);
  }
  const declared = Number(req.headers.get("content-length") ?? "0");
  // Multipart framing adds a little; allow 64 KiB of headers and fields on top of the file limit.
  if (declared > maxBytes + 65536) {
    throw new DomainError("file_too_large", `The upload is larger than the ${(maxBytes / 1048576).toFixed(0)} MiB limit. Purge unused blocks and layers and export again.`, 413);
  }
  let form: FormData;
  try {
    form = await req.formData();
  } catch {
    throw new DomainError("invalid_multipart", "The upload could not be read as multipart/form-data; send the file in a form field.", 400);
  }
  const file = form.get(fileField);
  if (!file || typeof file === "string") {
    throw new DomainError("missing_file", `Attach the layout file in a form field named “${fileField}”.`, 400);
  }
  const bytes = new Uint8Array(await file.arrayBuffer());
  if (bytes.byteLength > maxBytes) {
    throw new DomainError("file_too_large", `The file is ${(bytes.byteLength / 1048576).toFixed(1)} MiB; uploads are limited to ${(maxBytes / 1048576).toFixed(0)} MiB.`, 413);
  }
  const fields: Record<string, string> = {};
  for (const [key, value] of form.entries()) if (typeof value === "string") fields[key] = value;
  return { fileName: file.name || "layout.dxf", bytes, fields };
}
