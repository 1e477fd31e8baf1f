import "server-only";
import type { NextAuthOptions } from "next-auth";
import CredentialsProvider from "next-auth/providers/credentials";
import { getLastPasswordResetAt } from "@/db/queries/audit";
import { getEnv } from "@/lib/env";
import { DomainError } from "@/lib/errors";
import { authorizeCredentials, clientAddressFrom } from "./credentials";

/**
 * next-auth v4 configuration: e-mail + password, JWT sessions carrying only the
 * user id (token.sub); roles are always read from membership rows, never the token.
 */
export function getAuthOptions(): NextAuthOptions {
  const env = getEnv();
  return {
    secret: env.nextAuthSecret,
    session: { strategy: "jwt", maxAge: 12 * 60 * 60 },
    pages: { signIn: "/sign-in", error: "/sign-in" },
    providers: [
      CredentialsProvider({
        name: "E-mail and password",
        credentials: { email: { label: "E-mail", type: "email" }, password: { label: "Password", type: "password" } },
        async authorize(credentials, req) {
          try {
            const { id } = await authorizeCredentials(credentials ?? {}, clientAddressFrom(req?.headers));
            return { id: String(id) };
          } catch (err) {
            // next-auth passes a thrown message to the sign-in page; only our plain-words messages go out.
            if (err instanceof DomainError) throw new Error(err.message);
            throw new Error("Sign-in is unavailable right now. Try again in a minute.");
          }
        },
      }),
    ],
    callbacks: {
      async jwt({ token, user }) {
        if (user) token.sub = user.id;
        // A password reset ends every session issued before it (whole seconds: JWT iat precision).
        if (!user && token.sub && typeof token.iat === "number") {
          const changedAt = await getLastPasswordResetAt(Number(token.sub));
          if (changedAt && Math.floor(changedAt.getTime() / 1000) > token.iat) return {};
        }
        // Only the id travels in the token.
        return { sub: token.sub, iat: token.iat, exp: token.exp, jti: token.jti };
      },
      async session({ session, token }) {
        return { expires: session.expires, user: { id: token.sub } } as typeof session;
      },
    },
  };
}
