import { z } from "zod";
import { clientAddressFrom } from "@/lib/auth/credentials";
import { acceptInvitation } from "@/lib/auth/invitations";
import { personNameSchema, tokenSchema } from "@/lib/auth/schemas";
import { route } from "@/lib/http/route";

const body = z.object({
  token: tokenSchema,
  name: personNameSchema.optional(),
  password: z.string({ message: "Enter a password." }).min(1, { message: "Enter a password." }).max(72, { message: "Use at most 72 characters for the password." }),
});

/**
 * POST /api/v1/invitations/accept {token, name?, password} — public: the token is the credential.
 * A new invitee's password must meet the new-password rule; an existing account gives its current one.
 */
export const POST = route({ body }, async ({ req, body }) => {
  const { userId, email, workspaceSlug } = await acceptInvitation(body.token, body, new Date(), clientAddressFrom(req.headers));
  return Response.json({ userId, email, workspace: workspaceSlug }, { status: 201 });
});
