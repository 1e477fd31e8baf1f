/**
 * Column builders every schema file shares. Imports nothing from the schema
 * files themselves, so it can sit under all of them without an import cycle.
 */
import { integer } from "drizzle-orm/sqlite-core";

/** A UTC-millisecond timestamp column filled with the time of the insert (Date in code). */
export const timestampNow = (name: string) =>
  integer(name, { mode: "timestamp_ms" })
    .notNull()
    .$defaultFn(() => new Date());
