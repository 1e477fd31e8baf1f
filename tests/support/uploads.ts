/** Builds multipart upload requests for route-handler tests, and reads committed layout fixtures. */
import { readFileSync } from "node:fs";
import path from "node:path";

const layoutsDir = path.resolve(__dirname, "../fixtures/layouts");

export function fixtureBytes(name: string): Uint8Array {
  return new Uint8Array(readFileSync(path.join(layoutsDir, name)));
}

/** A multipart/form-data POST with `file` and any text fields. */
export function uploadRequest(
  url: string,
  file: { name: string; bytes: Uint8Array },
  fields: Record<string, string> = {},
  headers: Record<string, string> = {},
): Request {
  const form = new FormData();
  form.set("file", new Blob([new Uint8Array(file.bytes)]), file.name);
  for (const [k, v] of Object.entries(fields)) form.set(k, v);
  return new Request(url, { method: "POST", body: form, headers });
}

type Handler = (req: Request, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;

export async function send(handler: Handler, req: Request, params: Record<string, string> = {}) {
  const res = await handler(req, { params: Promise.resolve(params) });
  const text = await res.text();
  let body: Record<string, unknown> & { error?: { code: string; message: string } } = {};
  try {
    body = JSON.parse(text);
  } catch {
    body = {};
  }
  return { status: res.status, body, text, headers: res.headers };
}
