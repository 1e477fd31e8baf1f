/** Plain-text mail bodies. Links are full URLs on their own line so every client makes them clickable. */
export type MailContent = { subject: string; text: string };

export function invitationMail(p: { workspaceName: string; inviterName: string; roles: string[]; link: string; expiresAt: Date }): MailContent {
  return {
    subject: `You are invited to ${p.workspaceName} on Stokeline`,
    text: [
      `${p.inviterName} invited you to the ${p.workspaceName} workspace on Stokeline as ${p.roles.join(", ")}.`,
      "",
      "Open this link to set your password and join:",
      p.link,
      "",
      `The link works once and expires on ${p.expiresAt.toISOString().slice(0, 16).replace("T", " ")} UTC.`,
      "If you did not expect this, ignore this message.",
    ].join("\n"),
  };
}

export function passwordResetMail(p: { name: string; link: string; expiresAt: Date }): MailContent {
  return {
    subject: "Reset your Stokeline password",
    text: [
      `Hello ${p.name},`,
      "",
      "Someone (hopefully you) asked to reset your Stokeline password. Open this link to choose a new one:",
      p.link,
      "",
      `The link works once and expires on ${p.expiresAt.toISOString().slice(0, 16).replace("T", " ")} UTC.`,
      "If you did not ask for this, ignore this message; your password stays as it is.",
    ].join("\n"),
  };
}
