// lib/env.ts: the validated environment. Defaults are the documented ones in .env.example.
import { describe, expect, it } from "vitest";
import { getEnv } from "@/lib/env";

describe("getEnv", () => {
  it("applies the documented defaults", () => {
    const env = getEnv({ NODE_ENV: "development" });
    expect(env.databaseUrl).toBe("file:data/stokeline.db");
    expect(env.storageDir).toBe("data/files");
    expect(env.maxUploadBytes).toBe(26214400);
    expect(env.smtpUrl).toBeUndefined();
    expect(env.appUrl).toBe("http://localhost:3000");
  });

  it("treats empty strings (as in a copied .env.example) as unset", () => {
    expect(getEnv({ NODE_ENV: "development", SMTP_URL: "", DATABASE_AUTH_TOKEN: "", DATABASE_URL: "" }).databaseUrl).toBe("file:data/stokeline.db");
  });

  it("accepts a libSQL server URL with its token unchanged", () => {
    const env = getEnv({ NODE_ENV: "development", DATABASE_URL: "libsql://db.example.test", DATABASE_AUTH_TOKEN: "tok" });
    expect(env.databaseUrl).toBe("libsql://db.example.test");
    expect(env.databaseAuthToken).toBe("tok");
  });

  it.each([
    [{ DATABASE_URL: "postgres://x" }, /DATABASE_URL/],
    [{ SMTP_URL: "http://mail" }, /SMTP_URL must start with smtp/],
    [{ MAX_UPLOAD_BYTES: "lots" }, /MAX_UPLOAD_BYTES/],
    [{ NEXTAUTH_URL: "not a url" }, /NEXTAUTH_URL/],
  ])("names the bad variable: %o", (vars, message) => {
    expect(() => getEnv({ NODE_ENV: "development", ...vars })).toThrow(message);
  });

  it("requires NEXTAUTH_SECRET in production, except while next build collects pages", () => {
    expect(() => getEnv({ NODE_ENV: "production" })).toThrow(/NEXTAUTH_SECRET is required/);
    expect(getEnv({ NODE_ENV: "production", NEXT_PHASE: "phase-production-build" }).nextAuthSecret.length).toBeGreaterThan(20);
    expect(getEnv({ NODE_ENV: "production", NEXTAUTH_SECRET: "s3cret-value" }).nextAuthSecret).toBe("s3cret-value");
  });
});
