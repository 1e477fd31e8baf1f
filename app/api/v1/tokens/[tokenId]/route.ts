import { z } from "zod";
import { revokeApiToken } from "@/lib/auth/api-tokens";
import { requireUser } from "@/lib/auth/require";
import { idParam, route } from "@/lib/http/route";

const params = z.object({ tokenId: idParam });

/** DELETE /api/v1/tokens/:tokenId — revoke one of your own tokens. */
export const DELETE = route({ params }, async ({ params }) => {
  const user = await requireUser();
  await revokeApiToken(user.id, params.tokenId);
  return { ok: true };
});
