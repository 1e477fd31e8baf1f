// The real next-auth route handler (app/api/auth/[...nextauth]/route.ts), driven the way the
// sign-in form drives it: fetch a CSRF token, then POST the credentials callback. next/headers
// only works inside Next's request scope, so it is replaced by the test request's headers and
// cookies. Throttling thresholds: see tests/lib/auth/credentials.test.ts (common practice).
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";

const current = vi.hoisted(() => ({ headers: new Headers(), cookies: new Map<string, string>() }));
// next-auth loads next/headers with a plain CommonJS require at request time, so the stand-in
// goes into Node's require cache under the path next-auth resolves.
vi.hoisted(async () => {
  const { createRequire } = await import("node:module");
  const fromNextAuth = createRequire(createRequire(import.meta.url).resolve("next-auth/next"));
  const file = fromNextAuth.resolve("next/headers");
  const fake = {
    headers: async () => current.headers,
    cookies: async () => ({ getAll: () => [...current.cookies].map(([name, value]) => ({ name, value })) }),
  };
  fromNextAuth.cache[file] = { id: file, filename: file, loaded: true, exports: fake } as unknown as NodeJS.Module;
});

import { NextRequest } from "next/server";
import { GET, POST } from "@/app/api/auth/[...nextauth]/route";
import { DEMO_PASSWORD } from "@/db/seed";
import { MAX_ACCOUNT_FAILURES } from "@/lib/auth/rate-limit";
import { requestPasswordReset, resetPassword } from "@/lib/auth/password-reset";
import { listOutbox } from "@/db/queries/outbox";
import { scopeForTrustedCode } from "@/db/queries/scope";
import type { DemoContext } from "@/db/seed";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";

const base = "http://localhost:3000";

let demo: DemoContext;
beforeAll(async () => {
  process.env.NEXTAUTH_URL = base;
  demo = (await useTempDatabase())!;
});
afterAll(dropTempDatabase);

function remember(res: Response) {
  for (const c of res.headers.getSetCookie()) {
    const [pair] = c.split(";");
    const i = pair.indexOf("=");
    current.cookies.set(pair.slice(0, i), decodeURIComponent(pair.slice(i + 1)));
  }
}

async function send(method: "GET" | "POST", path: string, segments: string[], form?: Record<string, string>, address = "192.0.2.44") {
  current.headers = new Headers({ "x-forwarded-for": address, ...(form ? { "content-type": "application/x-www-form-urlencoded" } : {}) });
  current.headers.set("cookie", [...current.cookies].map(([k, v]) => `${k}=${encodeURIComponent(v)}`).join("; "));
  const req = new NextRequest(`${base}${path}`, { method, headers: current.headers, body: form ? new URLSearchParams(form).toString() : undefined });
  const res = await (method === "GET" ? GET : POST)(req, { params: Promise.resolve({ nextauth: segments }) });
  remember(res);
  return res;
}

async function signIn(email: string, password: string, address?: string): Promise<{ status: number; url: string }> {
  current.cookies.clear();
  const csrf = (await (await send("GET", "/api/auth/csrf", ["csrf"])).json()) as { csrfToken: string };
  const res = await send("POST", "/api/auth/callback/credentials", ["callback", "credentials"], { email, password, csrfToken: csrf.csrfToken, json: "true" }, address);
  const raw = await res.text();
  const body = JSON.parse(raw) as { url: string };
  return { status: res.status, url: body.url };
}

describe("next-auth credentials route", () => {
  it("signs in with a demo account and sets a session cookie carrying only the user id", async () => {
    const { status, url } = await signIn("designer@brookmere.test", DEMO_PASSWORD);
    expect(status).toBe(200);
    expect(new URL(url).searchParams.get("error")).toBeNull();
    expect(current.cookies.has("next-auth.session-token")).toBe(true);
    const session = await (await send("GET", "/api/auth/session", ["session"])).json();
    expect(Object.keys(session.user)).toEqual(["id"]);
    expect(session.user.id).toMatch(/^\d+$/);
  });

  it("refuses a wrong password with our message on the sign-in page", async () => {
    const { status, url } = await signIn("lead@brookmere.test", "definitely-wrong");
    expect(status).toBe(401);
    // next-auth answers with its error URL (which forwards to our /sign-in page); the form reads ?error.
    expect(new URL(url).pathname).toBe("/api/auth/error");
    expect(new URL(url).searchParams.get("error")).toMatch(/do not match/);
  });

  it(`throttles after ${MAX_ACCOUNT_FAILURES} wrong passwords: the right one is refused with a clear message`, async () => {
    for (let i = 0; i < MAX_ACCOUNT_FAILURES; i++) {
      const r = await signIn("reviewer@brookmere.test", `wrong-${i}`, `192.0.2.${100 + i}`);
      expect(new URL(r.url).searchParams.get("error")).toMatch(/do not match/);
    }
    const blocked = await signIn("reviewer@brookmere.test", DEMO_PASSWORD, "192.0.2.200");
    expect(blocked.status).toBe(401);
    expect(new URL(blocked.url).searchParams.get("error")).toMatch(/Too many failed sign-ins for this account\. Wait \d+ minutes?/);
    expect(current.cookies.has("next-auth.session-token")).toBe(false);
  });

  it("ends sessions issued before a password reset (OWASP: invalidate sessions on password change, from memory)", async () => {
    await signIn("designer2@brookmere.test", DEMO_PASSWORD);
    const before = await (await send("GET", "/api/auth/session", ["session"])).json();
    expect(before.user?.id).toMatch(/^\d+$/);
    const admin = scopeForTrustedCode({ userId: demo.users["admin@brookmere.test"], workspaceId: demo.workspaces.brookmere.id, roles: ["admin"] });
    // Reset a little later than the session was issued (JWT times are whole seconds).
    const later = new Date(Date.now() + 2000);
    await requestPasswordReset("designer2@brookmere.test", later);
    const token = (await listOutbox(admin)).find((m) => m.toAddress === "designer2@brookmere.test")!.text.match(/\/reset-password\/([A-Za-z0-9_-]+)/)![1];
    await resetPassword(token, "a-fresh-password-7", later);
    const after = await (await send("GET", "/api/auth/session", ["session"])).json();
    expect(after.user?.id).toBeUndefined();
  });
});
