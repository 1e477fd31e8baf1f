import "server-only";
import { and, desc, eq, inArray, isNull, or } from "drizzle-orm";
import { getDb } from "@/db";
import { mailOutbox } from "@/db/schema";
import { listMemberEmails } from "./members";
import type { WorkspaceScope } from "./scope";

export type OutboxMessage = {
  id: number;
  fromAddress: string;
  toAddress: string;
  subject: string;
  text: string;
  createdAt: Date;
};

export async function insertOutboxMessage(values: {
  workspaceId: number | null;
  fromAddress: string;
  toAddress: string;
  subject: string;
  text: string;
  html: string | null;
  messageId: string | null;
}): Promise<number> {
  const [row] = await getDb().insert(mailOutbox).values(values).returning({ id: mailOutbox.id });
  return row.id;
}

/**
 * Messages an admin of the scope's workspace may read: those sent for the
 * workspace, plus account mail (no workspace, e.g. password resets) addressed to
 * one of its members. Newest first.
 */
export async function listOutbox(scope: WorkspaceScope, limit = 200): Promise<OutboxMessage[]> {
  const emails = await listMemberEmails(scope);
  const accountMail = emails.length > 0 ? and(isNull(mailOutbox.workspaceId), inArray(mailOutbox.toAddress, emails)) : undefined;
  return getDb()
    .select({
      id: mailOutbox.id,
      fromAddress: mailOutbox.fromAddress,
      toAddress: mailOutbox.toAddress,
      subject: mailOutbox.subject,
      text: mailOutbox.text,
      createdAt: mailOutbox.createdAt,
    })
    .from(mailOutbox)
    .where(accountMail ? or(eq(mailOutbox.workspaceId, scope.workspaceId), accountMail) : eq(mailOutbox.workspaceId, scope.workspaceId))
    .orderBy(desc(mailOutbox.createdAt), desc(mailOutbox.id))
    .limit(limit);
}
