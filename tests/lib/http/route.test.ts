// lib/http: the route and action wrappers. Status codes per RFC 9110 §15; the 500 path must
// not leak the thrown error's message or stack (OWASP Error Handling Cheat Sheet, from memory).
import { afterEach, describe, expect, it, vi } from "vitest";
import { z } from "zod";
import { ConflictError } from "@/lib/errors";
import { formAction, formDataToObject } from "@/lib/http/action";
import { idParam, route } from "@/lib/http/route";
import { safeCallbackPath } from "@/lib/http/safe-redirect";
import { call } from "@/tests/support/requests";

afterEach(() => vi.restoreAllMocks());

describe("route()", () => {
  const echo = route({ params: z.object({ id: idParam }), body: z.object({ name: z.string().max(5) }) }, async ({ params, body }) => ({ id: params.id, name: body.name }));

  it("passes parsed params and body to the handler", async () => {
    const res = await call(echo, { params: { id: "7" }, json: { name: "abc" } });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ id: 7, name: "abc" });
  });

  it("maps a DomainError to its status and code", async () => {
    const h = route({}, async () => {
      throw new ConflictError("busy", "Someone else just changed it.");
    });
    const res = await call(h);
    expect(res.status).toBe(409);
    expect(res.body).toEqual({ error: { code: "busy", message: "Someone else just changed it." } });
  });

  it("answers an unexpected error with a generic 500 and no message or stack", async () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    const h = route({}, async () => {
      throw new Error("SQLITE_CORRUPT at /secret/path.ts:12");
    });
    const res = await call(h);
    expect(res.status).toBe(500);
    expect(res.text).not.toMatch(/SQLITE|secret|\.ts/);
    expect(res.body.error?.code).toBe("internal");
  });

  it("rejects an over-long string with the field named", async () => {
    const res = await call(echo, { params: { id: "7" }, json: { name: "abcdefgh" } });
    expect(res.status).toBe(400);
    expect(res.body.error?.message).toMatch(/^name: /);
  });
});

describe("formAction()", () => {
  const action = formAction(z.object({ email: z.email({ message: "Enter a valid e-mail." }), tags: z.array(z.string()).optional() }), async (input) => `ok ${input.email} ${input.tags?.length ?? 0}`);

  it("returns field errors instead of throwing", async () => {
    const f = new FormData();
    f.set("email", "nope");
    const state = await action({ status: "idle" }, f);
    expect(state).toMatchObject({ status: "error", fieldErrors: { email: "Enter a valid e-mail." } });
  });

  it("echoes what was submitted after a failure, but never passwords or tokens", async () => {
    const f = new FormData();
    f.set("email", "nope");
    f.set("password", "hunter2-secret");
    f.set("token", "abc");
    const state = await action({ status: "idle" }, f);
    expect(state.values).toEqual({ email: "nope" });
  });

  it("collects repeated name[] fields into arrays", async () => {
    const f = new FormData();
    f.set("email", "a@b.test");
    f.append("tags[]", "x");
    f.append("tags[]", "y");
    expect(formDataToObject(f)).toEqual({ email: "a@b.test", tags: ["x", "y"] });
    expect(await action({ status: "idle" }, f)).toEqual({ status: "ok", message: "ok a@b.test 2" });
  });
});

describe("safeCallbackPath()", () => {
  it.each([
    ["/w/brookmere", "/w/brookmere"],
    ["//evil.test/x", "/"],
    ["https://evil.test", "/"],
    ["/\\evil.test", "/"],
    [undefined, "/"],
  ])("%s → %s", (input, expected) => expect(safeCallbackPath(input)).toBe(expected));
});
