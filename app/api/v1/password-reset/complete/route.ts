import { z } from "zod";
import { newPasswordSchema } from "@/lib/auth/password";
import { resetPassword } from "@/lib/auth/password-reset";
import { tokenSchema } from "@/lib/auth/schemas";
import { route } from "@/lib/http/route";

/** POST /api/v1/password-reset/complete {token, password} — public; sets a new password once per link. */
export const POST = route({ body: z.object({ token: tokenSchema, password: newPasswordSchema }) }, async ({ body }) => {
  await resetPassword(body.token, body.password);
  return { ok: true };
});
