import { defineConfig } from "drizzle-kit";

export default defineConfig({
  dialect: "turso",
  schema: "./db/schema.ts",
  out: "./drizzle",
  dbCredentials: {
    url: process.env.DATABASE_URL ?? "file:data/stokeline.db",
    authToken: process.env.DATABASE_AUTH_TOKEN,
  },
});
