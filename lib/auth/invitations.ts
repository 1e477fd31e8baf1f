import "server-only";
/** Inviting members by e-mail link and accepting invitations (the invitee sets a password). */
import { getDb } from "@/db";
import { users } from "@/db/schema";
import { insertAuditEvent } from "@/db/queries/audit";
import {
  claimInvitation,
  findPendingInvitation,
  getInvitationByTokenHash,
  insertInvitation,
  markInvitationRevoked,
  type InvitationByToken,
} from "@/db/queries/invitations";
import { insertMembership, listMembers } from "@/db/queries/members";
import { scopeForTrustedCode, type WorkspaceScope } from "@/db/queries/scope";
import { getUserCredentialsByEmail } from "@/db/queries/users";
import { getEnv } from "@/lib/env";
import { ConflictError, DomainError, NotFoundError } from "@/lib/errors";
import { sendMail } from "@/lib/mail";
import { invitationMail } from "@/lib/mail/templates";
import { ROLE_LABELS, type Role } from "./roles";
import { hashPassword, newPasswordSchema, verifyPassword } from "./password";
import { assertSignInAllowed, recordSignInAttempt } from "./rate-limit";
import { createSecretToken, hashSecretToken } from "./tokens";

export const INVITATION_LIFETIME_MS = 7 * 24 * 60 * 60 * 1000;

/**
 * Invites `email` to the scope's workspace with `roles` and e-mails the link.
 * A pending invitation to the same address is revoked and replaced.
 * Throws ConflictError (409) when the address already belongs to a member, and
 * DomainError (502) when the mail cannot be sent (the invitation is then revoked).
 */
export async function inviteMember(
  scope: WorkspaceScope,
  ctx: { inviterName: string; workspaceName: string },
  input: { email: string; roles: Role[] },
  now = new Date(),
): Promise<{ invitationId: number; link: string }> {
  const members = await listMembers(scope);
  if (members.some((m) => m.email === input.email)) {
    throw new ConflictError("already_member", `${input.email} is already a member of this workspace; change their roles on the Members page instead.`);
  }
  const previous = await findPendingInvitation(scope, input.email, now);
  const { token, tokenHash } = createSecretToken();
  const expiresAt = new Date(now.getTime() + INVITATION_LIFETIME_MS);
  const db = getDb();
  const invitationId = await db.transaction(async (tx) => {
    if (previous !== null) await markInvitationRevoked(tx, scope, previous, now);
    const id = await insertInvitation(tx, scope, { email: input.email, roles: input.roles, tokenHash, expiresAt, createdAt: now });
    await insertAuditEvent(tx, {
      workspaceId: scope.workspaceId,
      actorUserId: scope.userId,
      action: "invitation.sent",
      objectType: "invitation",
      objectId: id,
      details: { email: input.email, roles: input.roles, replaced: previous },
      at: now,
    });
    return id;
  });
  const link = `${getEnv().appUrl}/invite/${token}`;
  try {
    await sendMail({
      to: input.email,
      workspaceId: scope.workspaceId,
      ...invitationMail({
        workspaceName: ctx.workspaceName,
        inviterName: ctx.inviterName,
        roles: input.roles.map((r) => ROLE_LABELS[r]),
        link,
        expiresAt,
      }),
    });
  } catch {
    await markInvitationRevoked(getDb(), scope, invitationId, now);
    throw new DomainError("mail_failed", "The invitation e-mail could not be sent. Check the mail settings (SMTP_URL) and try again.", 502);
  }
  return { invitationId, link };
}

/** Revokes a pending invitation. Throws NotFoundError when it is not pending in this workspace. */
export async function revokeInvitation(scope: WorkspaceScope, invitationId: number, now = new Date()): Promise<void> {
  const ok = await markInvitationRevoked(getDb(), scope, invitationId, now);
  if (!ok) throw new NotFoundError("That invitation is not pending any more (already accepted, revoked or never sent here).");
  await insertAuditEvent(getDb(), {
    workspaceId: scope.workspaceId,
    actorUserId: scope.userId,
    action: "invitation.revoked",
    objectType: "invitation",
    objectId: invitationId,
    at: now,
  });
}

export type OpenInvitation = InvitationByToken & { existingAccount: boolean };

/**
 * Looks up an invitation by the token from its link. Throws NotFoundError (404)
 * for an unknown token and ConflictError (409/410-like) for a used, revoked or
 * expired one, each with a message saying what to do.
 */
export async function getOpenInvitation(token: string, now = new Date()): Promise<OpenInvitation> {
  const inv = await getInvitationByTokenHash(hashSecretToken(token));
  if (!inv) throw new NotFoundError("This invitation link is not valid. Ask your workspace admin to send a new one.");
  if (inv.acceptedAt) throw new ConflictError("invitation_used", "This invitation has already been used. Sign in with your e-mail and password.");
  if (inv.revokedAt) throw new ConflictError("invitation_revoked", "This invitation was withdrawn. Ask your workspace admin to send a new one.");
  if (inv.expiresAt.getTime() <= now.getTime()) {
    throw new ConflictError("invitation_expired", "This invitation has expired. Ask your workspace admin to send a new one.");
  }
  const existing = await getUserCredentialsByEmail(inv.email);
  return { ...inv, existingAccount: existing !== null };
}

/**
 * Accepts an invitation. A new invitee gives a name and a new password; an
 * existing account proves itself with its current password. Creates the
 * account (if needed) and the membership in one transaction and records it.
 * Throws as getOpenInvitation, DomainError (400) for a missing name or weak
 * new password, DomainError (401) for a wrong current password, and
 * RateLimitedError (429) when that account's sign-in throttle is exhausted.
 */
export async function acceptInvitation(
  token: string,
  input: { name?: string; password: string },
  now = new Date(),
  clientAddress = "unknown",
): Promise<{ userId: number; email: string; workspaceSlug: string }> {
  const inv = await getOpenInvitation(token, now);
  const existing = await getUserCredentialsByEmail(inv.email);
  if (existing) {
    // Confirming an existing account is a password check like sign-in, so it shares sign-in's throttle.
    await assertSignInAllowed(inv.email, clientAddress, now);
    const ok = await verifyPassword(input.password, existing.passwordHash);
    await recordSignInAttempt(inv.email, clientAddress, ok, now);
    if (!ok) throw new DomainError("wrong_password", "That is not the current password of this account. Enter the password you sign in with.", 401);
  }
  if (!existing && !input.name) throw new DomainError("invalid_input", "Enter your name.", 400);
  if (!existing) {
    const pw = newPasswordSchema.safeParse(input.password);
    if (!pw.success) throw new DomainError("invalid_input", pw.error.issues[0].message, 400);
  }
  const passwordHash = existing ? null : await hashPassword(input.password);
  const userId = await getDb().transaction(async (tx) => {
    if (!(await claimInvitation(tx, inv.id, now))) {
      throw new ConflictError("invitation_used", "This invitation has just been used or withdrawn. Sign in, or ask for a new one.");
    }
    let id = existing?.id;
    if (id === undefined) {
      const [row] = await tx
        .insert(users)
        .values({ email: inv.email, name: input.name!, passwordHash: passwordHash!, createdAt: now })
        .returning({ id: users.id });
      id = row.id;
    }
    const scope = scopeForTrustedCode({ userId: id, workspaceId: inv.workspaceId, roles: inv.roles });
    const added = await insertMembership(tx, scope, id, inv.roles);
    if (!added) throw new ConflictError("already_member", "You are already a member of this workspace. Sign in to continue.");
    await insertAuditEvent(tx, {
      workspaceId: inv.workspaceId,
      actorUserId: id,
      action: "invitation.accepted",
      objectType: "invitation",
      objectId: inv.id,
      details: { roles: inv.roles, newAccount: !existing },
      at: now,
    });
    return id;
  });
  return { userId, email: inv.email, workspaceSlug: inv.workspaceSlug };
}
