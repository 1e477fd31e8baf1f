// Sign-in checks and throttling. Limits (5 failures per account, 20 per address, per 15 minutes)
// are our own choice following the OWASP Authentication Cheat Sheet's advice to throttle
// repeated failures (from memory); the numbers themselves are common practice, not a standard.
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { authorizeCredentials, clientAddressFrom } from "@/lib/auth/credentials";
import { MAX_ACCOUNT_FAILURES, MAX_ADDRESS_FAILURES, SIGN_IN_WINDOW_MS } from "@/lib/auth/rate-limit";
import { DEMO_PASSWORD, DEMO_PEOPLE } from "@/db/seed";
import { RateLimitedError, UnauthenticatedError } from "@/lib/errors";
import { dropTempDatabase, useTempDatabase } from "@/tests/support/temp-db";
import type { DemoContext } from "@/db/seed";

let demo: DemoContext;
beforeAll(async () => {
  demo = (await useTempDatabase())!;
});
afterAll(dropTempDatabase);

const t0 = new Date("2026-03-02T09:00:00Z");
const at = (minutes: number) => new Date(t0.getTime() + minutes * 60_000);

describe("authorizeCredentials", () => {
  it("accepts the right pair, case-insensitively on the e-mail, and returns only the id", async () => {
    const result = await authorizeCredentials({ email: "  Designer@Brookmere.TEST ", password: DEMO_PASSWORD }, "10.0.0.1", at(0));
    expect(result).toEqual({ id: demo.users["designer@brookmere.test"] });
  });

  it("refuses a wrong password and an unknown account with the same message", async () => {
    const wrong = authorizeCredentials({ email: "lead@brookmere.test", password: "not-it-at-all" }, "10.0.0.2", at(0));
    await expect(wrong).rejects.toBeInstanceOf(UnauthenticatedError);
    const unknown = await authorizeCredentials({ email: "nobody@brookmere.test", password: "whatever1234" }, "10.0.0.2", at(0)).catch((e) => e);
    const wrongMsg = await authorizeCredentials({ email: "lead@brookmere.test", password: "x" }, "10.0.0.2", at(0)).catch((e) => e);
    expect(unknown.message).toBe(wrongMsg.message);
  });

  it("rejects malformed input with a 400 and a plain message", async () => {
    const err = await authorizeCredentials({ email: "a@b.test" }, "10.0.0.3", at(0)).catch((e) => e);
    expect(err.status).toBe(400);
    expect(err.message).toMatch(/password/i);
    const long = await authorizeCredentials({ email: "a".repeat(300), password: "x" }, "10.0.0.3", at(0)).catch((e) => e);
    expect(long.status).toBe(400);
  });

  it(`throttles an account after ${MAX_ACCOUNT_FAILURES} failures, even with the right password, until the window passes`, async () => {
    const email = "reviewer@brookmere.test";
    for (let i = 0; i < MAX_ACCOUNT_FAILURES; i++) {
      await expect(authorizeCredentials({ email, password: `wrong-${i}` }, `10.1.0.${i}`, at(1 + i * 0.1))).rejects.toBeInstanceOf(UnauthenticatedError);
    }
    const blocked = await authorizeCredentials({ email, password: DEMO_PASSWORD }, "10.1.0.99", at(2)).catch((e) => e);
    expect(blocked).toBeInstanceOf(RateLimitedError);
    expect(blocked.status).toBe(429);
    expect(blocked.message).toMatch(/Too many failed sign-ins for this account/);
    expect(blocked.message).toMatch(/minute/);
    // Once the oldest failure is older than the window, the account may try again.
    const later = new Date(at(1).getTime() + SIGN_IN_WINDOW_MS + 60_000);
    await expect(authorizeCredentials({ email, password: DEMO_PASSWORD }, "10.1.0.99", later)).resolves.toEqual({ id: demo.users[email] });
  });

  it("does not let one account's failures lock another account", async () => {
    const email = "fab@brookmere.test";
    for (let i = 0; i < MAX_ACCOUNT_FAILURES; i++) await authorizeCredentials({ email, password: "nope" }, "10.2.0.1", at(30)).catch(() => undefined);
    await expect(authorizeCredentials({ email: "designer2@brookmere.test", password: DEMO_PASSWORD }, "10.2.0.2", at(30))).resolves.toBeTruthy();
  });

  it(`throttles a client address after ${MAX_ADDRESS_FAILURES} failures across accounts`, async () => {
    const address = "203.0.113.7";
    for (let i = 0; i < MAX_ADDRESS_FAILURES; i++) {
      await authorizeCredentials({ email: `probe${i}@example.test`, password: "guess" }, address, at(60)).catch(() => undefined);
    }
    const err = await authorizeCredentials({ email: DEMO_PEOPLE[0].email, password: DEMO_PASSWORD }, address, at(61)).catch((e) => e);
    expect(err).toBeInstanceOf(RateLimitedError);
    expect(err.message).toMatch(/from your network/);
    // The same account from elsewhere is fine.
    await expect(authorizeCredentials({ email: DEMO_PEOPLE[0].email, password: DEMO_PASSWORD }, "198.51.100.1", at(61))).resolves.toBeTruthy();
  });
});

describe("clientAddressFrom", () => {
  it("takes the first X-Forwarded-For hop, then X-Real-IP, else 'unknown'", () => {
    expect(clientAddressFrom({ "x-forwarded-for": "192.0.2.1, 10.0.0.1" })).toBe("192.0.2.1");
    expect(clientAddressFrom(new Headers({ "x-real-ip": "192.0.2.9" }))).toBe("192.0.2.9");
    expect(clientAddressFrom({})).toBe("unknown");
  });
});
