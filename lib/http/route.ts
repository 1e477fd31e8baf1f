import "server-only";
/**
 * The route-handler wrapper: parses params, query and JSON body with zod,
 * runs the handler (which authorises with requireMembership/requireAccessTo as
 * its first call), and maps every failure to JSON {error:{code,message}} with
 * the right status — never a stack trace.
 */
import { z } from "zod";
import { DomainError } from "@/lib/errors";
import { describeZodError, errorResponse } from "./errors";
import { runWithRequest } from "./request-context";

/** Largest JSON body accepted by JSON routes (file uploads use their own limit). */
export const MAX_JSON_BYTES = 64 * 1024;

type RouteContext = { params: Promise<Record<string, string | string[]>> };

type Schemas<P extends z.ZodType, Q extends z.ZodType, B extends z.ZodType> = {
  params?: P;
  query?: Q;
  body?: B;
};

export type RouteInput<P, Q, B> = { req: Request; params: P; query: Q; body: B };

function invalid(where: string, error: z.ZodError): DomainError {
  const { message, fields } = describeZodError(error);
  return new DomainError("invalid_input", where ? `${where} ${message}` : message, 400, { fields });
}

/** Reads and parses a JSON body; 415 for a wrong content type, 413 when too large, 400 for malformed JSON. */
export async function readJsonBody(req: Request, maxBytes = MAX_JSON_BYTES): Promise<unknown> {
  const type = req.headers.get("content-type") ?? "";
  if (!/^application\/(.+\+)?json\b/i.test(type)) {
    throw new DomainError("unsupported_media_type", "Send the request body as JSON with Content-Type: application/json.", 415);
  }
  const declared = Number(req.headers.get("content-length") ?? "0");
  if (declared > maxBytes) throw new DomainError("payload_too_large", `The request body is larger than ${maxBytes} bytes.`, 413);
  const text = await req.text();
  if (Buffer.byteLength(text, "utf8") > maxBytes) throw new DomainError("payload_too_large", `The request body is larger than ${maxBytes} bytes.`, 413);
  if (text.trim() === "") throw new DomainError("invalid_json", "The request body is empty; send a JSON object.", 400);
  try {
    return JSON.parse(text);
  } catch {
    throw new DomainError("invalid_json", "The request body is not valid JSON. Check quotes, commas and brackets.", 400);
  }
}

/**
 * Builds a Next route handler. Example:
 *   export const PATCH = route({ params, body }, async ({ params, body }) => { … return { ok: true }; });
 * A returned Response is sent as is; any other value as JSON with status 200.
 */
export function route<P extends z.ZodType = z.ZodType<Record<string, never>>, Q extends z.ZodType = z.ZodType<Record<string, never>>, B extends z.ZodType = z.ZodType<undefined>>(
  schemas: Schemas<P, Q, B>,
  handler: (input: RouteInput<z.output<P>, z.output<Q>, z.output<B>>) => Promise<unknown>,
): (req: Request, ctx: RouteContext) => Promise<Response> {
  return (req, ctx) => runWithRequest(req, async () => {
    try {
      const rawParams = (await ctx?.params) ?? {};
      const params = schemas.params ? schemas.params.safeParse(rawParams) : { success: true as const, data: rawParams };
      if (!params.success) throw new DomainError("not_found", "Nothing lives at that address; check the id in the URL.", 404);
      const url = new URL(req.url);
      const rawQuery = Object.fromEntries(url.searchParams);
      const query = schemas.query ? schemas.query.safeParse(rawQuery) : { success: true as const, data: rawQuery };
      if (!query.success) throw invalid("Query parameter", query.error);
      let body: unknown = undefined;
      if (schemas.body) {
        const parsed = schemas.body.safeParse(await readJsonBody(req));
        if (!parsed.success) throw invalid("", parsed.error);
        body = parsed.data;
      }
      const result = await handler({ req, params: params.data as z.output<P>, query: query.data as z.output<Q>, body: body as z.output<B> });
      if (result instanceof Response) return result;
      return Response.json(result ?? { ok: true });
    } catch (err) {
      return errorResponse(err);
    }
  });
}

/** Route param: a positive integer id given as text. */
export const idParam = z.coerce.number().int().positive().max(Number.MAX_SAFE_INTEGER);
