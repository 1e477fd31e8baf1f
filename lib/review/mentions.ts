/**
 * Mentions in review comments: "@Ada Quill" or "@ada@brookmere.example" →
 * member ids, and the notification a comment sends. Pure; the comment service
 * stores the comment and hands the notifications to the mail layer.
 */
import { DomainError, ForbiddenError } from "../errors";
import type { ReviewNotification, Role } from "./machine";

export interface MentionableMember {
  id: string;
  name: string;
  email: string;
}

/** Longest comment accepted, in characters. */
export const MAX_COMMENT_CHARS = 8000;

const WORD_CHAR = /[\p{L}\p{N}_.-]/u;
const EMAIL_AT = /^([^\s@<>()[\]{}",;:]+@[^\s@<>()[\]{}",;:]+\.[^\s@<>()[\]{}",;:]*[^\s@<>()[\]{}",;:.])/u;

/**
 * Find the members a comment mentions. A mention is "@" (not inside a word or
 * an e-mail address) followed by a member's e-mail address or full name,
 * matched without regard to case; the longest matching name wins, so
 * "@Ada Quillon" is not "@Ada Quill". Unknown names are ignored.
 * @returns member ids, each once, in order of first mention.
 */
export function parseMentions(text: string, members: readonly MentionableMember[]): string[] {
  const byEmail = new Map(members.map((m) => [m.email.trim().toLowerCase(), m.id]));
  // Longest names first so a name that is a prefix of another cannot steal the mention.
  const byName = members
    .map((m) => ({ id: m.id, name: m.name.trim().replace(/\s+/g, " ").toLowerCase() }))
    .filter((m) => m.name.length > 0)
    .sort((a, b) => b.name.length - a.name.length);
  const found: string[] = [];
  const add = (id: string) => {
    if (!found.includes(id)) found.push(id);
  };
  // Whitespace runs count as one space when comparing names.
  const flat = text.replace(/\s+/g, " ");
  const lower = flat.toLowerCase();
  for (let i = 0; i < flat.length; i++) {
    if (flat[i] !== "@") continue;
    if (i > 0 && WORD_CHAR.test(flat[i - 1])) continue; // part of an e-mail address or a word, not a mention
    const rest = flat.slice(i + 1);
    const email = EMAIL_AT.exec(rest);
    if (email) {
      const id = byEmail.get(email[1].toLowerCase());
      if (id) {
        add(id);
        i += email[1].length;
        continue;
      }
    }
    const restLower = lower.slice(i + 1);
    for (const m of byName) {
      if (!restLower.startsWith(m.name)) continue;
      const after = restLower[m.name.length];
      if (after !== undefined && /[\p{L}\p{N}_]/u.test(after)) continue; // "@Ada Quillon" is not "@Ada Quill"
      add(m.id);
      i += m.name.length;
      break;
    }
  }
  return found;
}

export interface CommentPlan {
  body: string;
  mentionedMemberIds: string[];
  audit: { action: string; details: Record<string, unknown> };
  notifications: ReviewNotification[];
}

/**
 * Check a new comment and work out its audit event and mention notifications.
 * Comments are allowed in every review state (a cleared revision can still be
 * discussed); the author is never notified of their own mention.
 * @throws ForbiddenError when the author holds only the lead role (leads read, never write);
 *   DomainError (400) for an empty or over-long comment.
 */
export function planComment(
  author: { memberId: string; roles: readonly Role[] },
  body: string,
  members: readonly MentionableMember[],
  target: { segmentId?: string | null; point?: { x_m: number; y_m: number } | null; parentId?: string | null } = {},
): CommentPlan {
  if (!author.roles.some((r) => r !== "lead")) {
    throw new ForbiddenError("Leads can read review comments but not write them; ask a team member with a working role.");
  }
  const text = body.trim();
  if (text === "") throw new DomainError("invalid_comment", "The comment is empty; write something before posting.", 400);
  if (text.length > MAX_COMMENT_CHARS) {
    throw new DomainError("invalid_comment", `The comment is ${text.length} characters; keep it under ${MAX_COMMENT_CHARS}.`, 400);
  }
  if (target.point && !(Number.isFinite(target.point.x_m) && Number.isFinite(target.point.y_m))) {
    throw new DomainError("invalid_comment", "The comment's pin is not a point on the drawing; click the drawing again to place it.", 400);
  }
  const mentioned = parseMentions(text, members).filter((id) => id !== author.memberId);
  return {
    body: text,
    mentionedMemberIds: mentioned,
    audit: {
      action: "review.commented",
      details: { segmentId: target.segmentId ?? null, point: target.point ?? null, parentId: target.parentId ?? null, mentioned },
    },
    notifications:
      mentioned.length > 0 ? [{ kind: "mentioned", to: mentioned.map((memberId) => ({ memberId })), details: { excerpt: text.slice(0, 200) } }] : [],
  };
}
