/**
 * Early redirect for signed-out visitors to workspace pages, keeping the full
 * path as callbackUrl (layouts cannot see it). The real check is always on the
 * server, in lib/auth/require.ts; this only saves a round trip.
 */
import { NextResponse, type NextRequest } from "next/server";
import { getToken } from "next-auth/jwt";
import { getEnv } from "@/lib/env";

export async function proxy(req: NextRequest): Promise<NextResponse> {
  const token = await getToken({ req, secret: getEnv().nextAuthSecret }).catch(() => null);
  if (token?.sub) return NextResponse.next();
  const url = req.nextUrl.clone();
  url.pathname = "/sign-in";
  url.search = `?callbackUrl=${encodeURIComponent(req.nextUrl.pathname + req.nextUrl.search)}`;
  return NextResponse.redirect(url);
}

export const config = { matcher: ["/w/:path*", "/welcome"] };
