import "server-only";
/**
 * Outgoing e-mail through nodemailer. With SMTP_URL set, messages go over SMTP;
 * without it, a local outbox transport stores each message in mail_outbox
 * (readable by workspace admins at /w/<workspace>/admin/outbox).
 */
import nodemailer, { type Transporter } from "nodemailer";
import { insertOutboxMessage } from "@/db/queries/outbox";
import { getEnv } from "@/lib/env";

export type OutgoingMail = {
  to: string;
  subject: string;
  text: string;
  html?: string;
  /** The workspace the message concerns (shown in that workspace's outbox); omit for account mail. */
  workspaceId?: number | null;
};

export type SentMail = { transport: "smtp" | "outbox"; messageId: string | null; outboxId?: number };

let smtpTransport: { url: string; transporter: Transporter } | undefined;

function smtpFor(url: string): Transporter {
  if (smtpTransport?.url !== url) smtpTransport = { url, transporter: nodemailer.createTransport(url) };
  return smtpTransport.transporter;
}

/** Builds the message with nodemailer's JSON transport so the outbox stores exactly what SMTP would carry. */
const jsonTransport = nodemailer.createTransport({ jsonTransport: true });

/**
 * Sends one message. Throws the transport's error when the SMTP server refuses
 * it (callers decide whether that aborts their change).
 */
export async function sendMail(mail: OutgoingMail): Promise<SentMail> {
  const env = getEnv();
  const message = { from: env.mailFrom, to: mail.to, subject: mail.subject, text: mail.text, html: mail.html };
  if (env.smtpUrl) {
    const info = await smtpFor(env.smtpUrl).sendMail(message);
    return { transport: "smtp", messageId: info.messageId ?? null };
  }
  const info = await jsonTransport.sendMail(message);
  const outboxId = await insertOutboxMessage({
    workspaceId: mail.workspaceId ?? null,
    fromAddress: env.mailFrom,
    toAddress: mail.to,
    subject: mail.subject,
    text: mail.text,
    html: mail.html ?? null,
    messageId: info.messageId ?? null,
  });
  return { transport: "outbox", messageId: info.messageId ?? null, outboxId };
}
