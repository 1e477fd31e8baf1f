import { z } from "zod";
import { requestPasswordReset } from "@/lib/auth/password-reset";
import { emailSchema } from "@/lib/auth/schemas";
import { route } from "@/lib/http/route";

/** POST /api/v1/password-reset {email} — public; 202 whether or not the account exists (no probing). */
export const POST = route({ body: z.object({ email: emailSchema }) }, async ({ body }) => {
  await requestPasswordReset(body.email);
  return Response.json({ ok: true, message: "If an account uses that address, a reset link is on its way." }, { status: 202 });
});
