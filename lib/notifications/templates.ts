/**
 * Plain-text e-mails for review notifications. Pure. Links are full URLs on
 * their own line so every mail client makes them clickable.
 */
import type { NotificationKind } from "./kinds";

export type ReviewMailInput = {
  kind: NotificationKind;
  recipientName: string;
  actorName: string;
  workspaceName: string;
  chipName: string;
  revisionNumber: number;
  link: string;
  details: Record<string, unknown>;
};

const text = (v: unknown): string | null => (typeof v === "string" && v.trim() !== "" ? v.trim() : null);

/** The one-line summary shown in the inbox and used as the e-mail's first line. */
export function notificationSummary(input: Omit<ReviewMailInput, "recipientName" | "link" | "workspaceName">): string {
  const rev = `${input.chipName} revision ${input.revisionNumber}`;
  switch (input.kind) {
    case "review_requested": {
      const stage = input.details.stage === "fab" ? "fab review" : "fluidics review";
      if (input.details.updated) return `${input.actorName} put a newer analysis of ${rev} under ${stage}.`;
      return input.details.stage === "fab" ? `${rev} passed fluidics review and waits for fab review.` : `${input.actorName} asks for ${stage} of ${rev}.`;
    }
    case "changes_requested":
      return `${input.actorName} requested changes to ${rev} (${input.details.stage === "fab" ? "fab" : "fluidics"} review).`;
    case "cleared":
      return `${input.actorName} cleared ${rev} for tape-out${text(input.details.fabName) ? ` at ${text(input.details.fabName)}` : ""}.`;
    case "mentioned":
      return `${input.actorName} mentioned you in a comment on ${rev}.`;
  }
}

const SUBJECTS: Record<NotificationKind, (rev: string) => string> = {
  review_requested: (rev) => `Review requested: ${rev}`,
  changes_requested: (rev) => `Changes requested: ${rev}`,
  cleared: (rev) => `Cleared for tape-out: ${rev}`,
  mentioned: (rev) => `You were mentioned on ${rev}`,
};

/** Subject and body of one notification e-mail. */
export function reviewMail(input: ReviewMailInput): { subject: string; text: string } {
  const rev = `${input.chipName} revision ${input.revisionNumber}`;
  const lines = [`Hello ${input.recipientName},`, "", notificationSummary(input)];
  const note = text(input.details.note) ?? text(input.details.excerpt);
  if (note) lines.push("", input.kind === "mentioned" ? "They wrote:" : "Their note:", ...note.split("\n").map((l) => `> ${l}`));
  if (input.kind === "cleared") {
    lines.push("", `Process: ${text(input.details.process) ?? "—"}`, `File SHA-256: ${text(input.details.fileSha256) ?? "—"}`);
    lines.push("The clearance records the design review only; the fab's own design rules and your local safety practice still apply.");
  }
  lines.push("", "Open it in Stokeline:", input.link, "", `You receive this as a member of ${input.workspaceName}. Choose which review e-mails you get under Notifications → E-mail settings.`);
  return { subject: `${SUBJECTS[input.kind](rev)} — ${input.workspaceName}`, text: lines.join("\n") };
}
