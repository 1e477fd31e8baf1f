/** Helpers to call exported route handlers directly with a Request. */
type Handler = (req: Request, ctx: { params: Promise<Record<string, string | string[]>> }) => Promise<Response>;

export async function call(
  handler: Handler,
  opts: { method?: string; url?: string; params?: Record<string, string>; json?: unknown; body?: string; headers?: Record<string, string> } = {},
): Promise<{ status: number; body: { error?: { code: string; message: string; details?: unknown } } & Record<string, unknown>; text: string; headers: Headers }> {
  const headers: Record<string, string> = { ...(opts.headers ?? {}) };
  let body: string | undefined = opts.body;
  if (opts.json !== undefined) {
    body = JSON.stringify(opts.json);
    headers["content-type"] ??= "application/json";
  } else if (body !== undefined) headers["content-type"] ??= "application/json";
  const req = new Request(opts.url ?? "http://localhost/api/v1/test", { method: opts.method ?? (body !== undefined ? "POST" : "GET"), headers, body });
  const res = await handler(req, { params: Promise.resolve(opts.params ?? {}) });
  const text = await res.text();
  let parsed: Record<string, unknown> = {};
  try {
    parsed = JSON.parse(text);
  } catch {
    parsed = {};
  }
  return { status: res.status, body: parsed, text, headers: res.headers };
}
