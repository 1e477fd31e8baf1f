import { buildOpenApi } from "@/lib/api/openapi";

/** GET /api/v1/openapi.json — the API's OpenAPI 3.1 description (public, like any API's description). */
export function GET(): Response {
  return Response.json(buildOpenApi());
}
