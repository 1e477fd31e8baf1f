/**
 * The kinds of review notification and their words. Pure: no server imports,
 * so the preferences form and the inbox can use them.
 */
export const NOTIFICATION_KINDS = ["review_requested", "changes_requested", "cleared", "mentioned"] as const;
export type NotificationKind = (typeof NOTIFICATION_KINDS)[number];

export const NOTIFICATION_LABELS: Record<NotificationKind, { title: string; explain: string }> = {
  review_requested: { title: "Review requested", explain: "A revision waits for your fluidics or fab review." },
  changes_requested: { title: "Changes requested", explain: "A reviewer sent your revision back with a note." },
  cleared: { title: "Cleared for tape-out", explain: "A revision you uploaded (or lead) was signed off for the fab." },
  mentioned: { title: "Mentioned in a comment", explain: "Someone wrote @your name in a review comment." },
};

export function isNotificationKind(value: unknown): value is NotificationKind {
  return typeof value === "string" && (NOTIFICATION_KINDS as readonly string[]).includes(value);
}
