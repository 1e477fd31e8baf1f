import "server-only";
/**
 * Notification fan-out: who a review step's notifications reach, the inbox
 * rows written in the step's transaction, and the e-mails sent after it
 * commits through lib/mail, honouring each member's preferences. In-app
 * notifications are always written; e-mail is on unless the member turned it off.
 */
import { listMembers, type MemberView } from "@/db/queries/members";
import * as q from "@/db/queries/review";
import type { WorkspaceScope } from "@/db/queries/scope";
import { getEnv } from "@/lib/env";
import { sendMail } from "@/lib/mail";
import type { Recipient, ReviewNotification } from "@/lib/review/machine";
import { NOTIFICATION_KINDS, type NotificationKind } from "./kinds";
import { notificationSummary, reviewMail } from "./templates";

/** A notification addressed to one member, ready to store and mail. */
export type PlannedNotification = {
  userId: number;
  kind: NotificationKind;
  summary: string;
  details: Record<string, unknown>;
};

export type RevisionFacts = { revisionId: number; chipId: number; chipName: string; number: number };

/**
 * Expands the machine's recipients (a member, or every holder of a role minus
 * some) into members of the scope's workspace; the actor never notifies
 * themselves, and each member gets one notification per kind per step.
 * Member ids in the machine are user ids as text.
 */
export function planNotifications(
  notifications: readonly ReviewNotification[],
  members: readonly MemberView[],
  actor: { userId: number; name: string },
  revision: RevisionFacts,
): PlannedNotification[] {
  const planned: PlannedNotification[] = [];
  for (const n of notifications) {
    const ids = new Set<number>();
    for (const r of n.to as Recipient[]) {
      if ("memberId" in r) {
        const id = Number(r.memberId);
        if (members.some((m) => m.userId === id)) ids.add(id);
      } else {
        for (const m of members) if (m.roles.includes(r.role) && !r.exceptMemberIds.includes(String(m.userId))) ids.add(m.userId);
      }
    }
    ids.delete(actor.userId);
    const summary = notificationSummary({ kind: n.kind, actorName: actor.name, chipName: revision.chipName, revisionNumber: revision.number, details: n.details });
    for (const userId of ids) planned.push({ userId, kind: n.kind, summary, details: n.details });
  }
  return planned;
}

/** Members of the workspace, for recipients and mentions. */
export function listWorkspaceMembers(scope: WorkspaceScope): Promise<MemberView[]> {
  return listMembers(scope);
}

/** The link a notification points at: the revision's review screen. */
export function reviewLink(slug: string, revision: RevisionFacts): string {
  return `${getEnv().appUrl}/w/${slug}/chips/${revision.chipId}/revisions/${revision.number}/review`;
}

/**
 * Sends the e-mails of planned notifications whose recipients keep that kind
 * switched on. Call after the step's transaction committed. A failing SMTP
 * server does not undo the step: the failure is logged and counted.
 * @returns how many messages were sent and how many failed.
 */
export async function deliverEmails(
  scope: WorkspaceScope,
  workspace: { id: number; slug: string; name: string },
  planned: readonly PlannedNotification[],
  members: readonly MemberView[],
  actorName: string,
  revision: RevisionFacts,
): Promise<{ sent: number; failed: number }> {
  if (planned.length === 0) return { sent: 0, failed: 0 };
  const prefs = await q.getEmailPreferences(scope, [...new Set(planned.map((p) => p.userId))]);
  let sent = 0;
  let failed = 0;
  for (const p of planned) {
    if (prefs.get(p.userId)?.get(p.kind) === false) continue;
    const member = members.find((m) => m.userId === p.userId);
    if (!member) continue;
    const mail = reviewMail({
      kind: p.kind,
      recipientName: member.name,
      actorName,
      workspaceName: workspace.name,
      chipName: revision.chipName,
      revisionNumber: revision.number,
      link: reviewLink(workspace.slug, revision),
      details: p.details,
    });
    try {
      await sendMail({ to: member.email, subject: mail.subject, text: mail.text, workspaceId: workspace.id });
      sent += 1;
    } catch (err) {
      failed += 1;
      console.error(`Review e-mail to member ${p.userId} failed:`, err instanceof Error ? err.message : err);
    }
  }
  return { sent, failed };
}

/** The member's e-mail switches for every kind (true = e-mail on). */
export async function getMyEmailPreferences(scope: WorkspaceScope): Promise<Record<NotificationKind, boolean>> {
  const stored = (await q.getEmailPreferences(scope, [scope.userId])).get(scope.userId);
  return Object.fromEntries(NOTIFICATION_KINDS.map((k) => [k, stored?.get(k) ?? true])) as Record<NotificationKind, boolean>;
}

/** Saves the member's e-mail switches (kinds not given keep their setting). */
export async function saveMyEmailPreferences(scope: WorkspaceScope, prefs: Partial<Record<NotificationKind, boolean>>): Promise<void> {
  await q.saveEmailPreferences(scope, prefs);
}

export { listInbox, countUnread, markRead, type InboxItem } from "@/db/queries/review";
