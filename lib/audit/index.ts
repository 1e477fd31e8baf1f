import "server-only";
/**
 * Recording who did what, when, to which object. Append-only: there is no
 * update or delete function, and database triggers refuse both.
 */
import { getDb, type Db } from "@/db";
import { insertAuditEvent, type AuditInput } from "@/db/queries/audit";

type Tx = Parameters<Parameters<Db["transaction"]>[0]>[0];

/** Appends one audit event; pass `tx` to make it part of the change it records. */
export async function recordAuditEvent(event: AuditInput, tx?: Tx): Promise<void> {
  await insertAuditEvent(tx ?? getDb(), event);
}

export type { AuditInput };
