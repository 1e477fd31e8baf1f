/** Input shapes for the account and membership forms and routes, shared by client forms and server. */
import { z } from "zod";
import { ROLES } from "./roles";

export const emailSchema = z
  .string({ message: "Enter an e-mail address." })
  .trim()
  .min(1, { message: "Enter an e-mail address." })
  .max(254, { message: "That e-mail address is too long (254 characters at most)." })
  .pipe(z.email({ message: "Enter a valid e-mail address, like name@example.com." }))
  .transform((v) => v.toLowerCase());

export const rolesSchema = z
  .array(z.enum(ROLES, { message: `Each role must be one of: ${ROLES.join(", ")}.` }), { message: "Choose at least one role." })
  .min(1, { message: "Choose at least one role." })
  .max(ROLES.length)
  .transform((roles) => [...new Set(roles)]);

export const personNameSchema = z
  .string({ message: "Enter your name." })
  .trim()
  .min(1, { message: "Enter your name." })
  .max(120, { message: "Use at most 120 characters for the name." });

export const inviteSchema = z.object({ email: emailSchema, roles: rolesSchema });
export const memberRolesSchema = z.object({ roles: rolesSchema });
export const tokenSchema = z.string({ message: "The link is incomplete." }).min(20, { message: "The link is incomplete; open it again from the e-mail." }).max(200, { message: "That link is not valid." });
