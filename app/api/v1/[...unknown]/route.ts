import { NotFoundError } from "@/lib/errors";
import { errorResponse } from "@/lib/http/errors";

/** Any /api/v1 address no handler serves: a JSON 404 (not Next's HTML page), for every method. */
async function unknown(): Promise<Response> {
  return errorResponse(new NotFoundError("No API endpoint lives at that address; see /api/v1/openapi.json for the list."));
}

export { unknown as GET, unknown as POST, unknown as PUT, unknown as PATCH, unknown as DELETE };
