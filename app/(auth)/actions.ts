"use server";
import { headers } from "next/headers";
import { redirect } from "next/navigation";
import { z } from "zod";
import { clientAddressFrom } from "@/lib/auth/credentials";
import { acceptInvitation } from "@/lib/auth/invitations";
import { newPasswordSchema } from "@/lib/auth/password";
import { requestPasswordReset, resetPassword } from "@/lib/auth/password-reset";
import { emailSchema, personNameSchema, tokenSchema } from "@/lib/auth/schemas";
import { formAction } from "@/lib/http/action";

export const requestResetAction = formAction(z.object({ email: emailSchema }), async ({ email }) => {
  await requestPasswordReset(email);
  return `If an account uses ${email}, a reset link is on its way. It works once, for one hour.`;
});

const resetSchema = z
  .object({ token: tokenSchema, password: newPasswordSchema, confirm: z.string().max(200) })
  .refine((v) => v.password === v.confirm, { message: "The two passwords differ; type the same password twice.", path: ["confirm"] });

export const resetPasswordAction = formAction(resetSchema, async ({ token, password }) => {
  const { email } = await resetPassword(token, password);
  redirect(`/sign-in?notice=password-reset&email=${encodeURIComponent(email)}`);
});

const acceptSchema = z
  .object({
    token: tokenSchema,
    existing: z.enum(["yes", "no"]),
    name: z.string().max(500).optional(),
    password: z.string().max(200),
    confirm: z.string().max(200).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.existing === "yes") {
      if (!v.password) ctx.addIssue({ code: "custom", path: ["password"], message: "Enter the password you sign in with." });
      return;
    }
    const name = personNameSchema.safeParse(v.name ?? "");
    if (!name.success) ctx.addIssue({ code: "custom", path: ["name"], message: name.error.issues[0].message });
    const pw = newPasswordSchema.safeParse(v.password);
    if (!pw.success) ctx.addIssue({ code: "custom", path: ["password"], message: pw.error.issues[0].message });
    else if (v.password !== v.confirm) ctx.addIssue({ code: "custom", path: ["confirm"], message: "The two passwords differ; type the same password twice." });
  });

export const acceptInvitationAction = formAction(acceptSchema, async ({ token, name, password }) => {
  const { email } = await acceptInvitation(token, { name: name?.trim(), password }, new Date(), clientAddressFrom(await headers()));
  redirect(`/sign-in?notice=joined&email=${encodeURIComponent(email)}`);
});
