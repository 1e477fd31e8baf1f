import NextAuth from "next-auth";
import { getAuthOptions } from "@/lib/auth/options";

type Ctx = { params: Promise<{ nextauth: string[] }> };

// Options are built per request so the validated environment is read at run time, not at build time.
async function handler(req: Request, ctx: Ctx): Promise<Response> {
  return NextAuth(req as never, ctx as never, getAuthOptions()) as Promise<Response>;
}

export { handler as GET, handler as POST };
