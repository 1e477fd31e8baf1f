import "server-only";
import { z } from "zod";
import { DomainError, RateLimitedError } from "@/lib/errors";

export type ErrorBody = { error: { code: string; message: string; details?: unknown } };

/** Plain-words summary of a zod failure, naming the field: "roles: Choose at least one role." */
export function describeZodError(error: z.ZodError): { message: string; fields: Record<string, string> } {
  const fields: Record<string, string> = {};
  for (const issue of error.issues) {
    const key = issue.path.map(String).join(".") || "_";
    fields[key] ??= issue.message;
  }
  const first = error.issues[0];
  const where = first?.path.length ? `${first.path.map(String).join(".")}: ` : "";
  return { message: `${where}${first?.message ?? "The input is not valid."}`, fields };
}

/**
 * Turns any thrown value into a JSON error response: DomainError → its status,
 * code and message; ZodError → 400; anything else → 500 with a generic message
 * (logged on the server, never a stack trace to the client).
 */
export function errorResponse(err: unknown): Response {
  if (err instanceof DomainError) {
    const body: ErrorBody = { error: { code: err.code, message: err.message, ...(err.details !== undefined ? { details: err.details } : {}) } };
    const headers: Record<string, string> = {};
    if (err instanceof RateLimitedError) headers["retry-after"] = String(err.retryAfterS);
    return Response.json(body, { status: err.status, headers });
  }
  if (err instanceof z.ZodError) {
    const { message, fields } = describeZodError(err);
    return Response.json({ error: { code: "invalid_input", message, details: { fields } } } satisfies ErrorBody, { status: 400 });
  }
  console.error("Unexpected error in a route handler:", err);
  return Response.json(
    { error: { code: "internal", message: "Something went wrong on our side. Try again; if it keeps happening, tell your admin." } } satisfies ErrorBody,
    { status: 500 },
  );
}
