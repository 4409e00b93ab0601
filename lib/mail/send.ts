import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import { env } from "@/lib/env";

export type OutgoingMail = { to: string[]; subject: string; text: string; html?: string };

/** What happened to one message; sending never throws. */
export type MailResult =
  | { ok: true; messageId: string; accepted: string[]; rejected: string[] }
  | { ok: false; error: string };

// A message that cannot be handed over quickly is reported as failed, not waited for.
const TIMEOUTS = { connectionTimeout: 10_000, greetingTimeout: 10_000, socketTimeout: 30_000 };

const transports = new Map<string, Transporter>();

function transportFor(smtpUrl: string): Transporter {
  let t = transports.get(smtpUrl);
  if (!t) {
    t = nodemailer.createTransport({ url: smtpUrl, ...TIMEOUTS });
    transports.set(smtpUrl, t);
  }
  return t;
}

/** The mail server's host and port, without any credentials in the URL. */
export function describeSmtpUrl(smtpUrl: string): string {
  const u = new URL(smtpUrl);
  const secure = u.protocol === "smtps:";
  return `${u.hostname}:${u.port || (secure ? "465" : "587")}${secure ? " (TLS)" : ""}`;
}

const addressList = (v: unknown): string[] =>
  Array.isArray(v) ? v.map((a) => (typeof a === "string" ? a : String((a as { address?: string }).address ?? ""))) : [];

/**
 * Sends one message through the given SMTP server. Never throws: a failure is logged
 * and returned, so mail trouble cannot undo the work that caused the message.
 */
export async function sendMailVia(smtpUrl: string | undefined, mail: OutgoingMail): Promise<MailResult> {
  const label = `"${mail.subject}" to ${mail.to.length} recipient(s)`;
  const fail = (error: string): MailResult => {
    console.error(`mail: not sent ${label}: ${error}`);
    return { ok: false, error };
  };
  try {
    if (!smtpUrl) return fail("no mail server is configured (SMTP_URL is unset)");
    const to = [...new Set(mail.to.map((a) => a.trim()).filter(Boolean))];
    if (to.length === 0) return fail("no recipients");
    const info = await transportFor(smtpUrl).sendMail({
      from: env().MAIL_FROM,
      to,
      subject: mail.subject,
      text: mail.text,
      ...(mail.html !== undefined ? { html: mail.html } : {}),
    });
    const accepted = addressList(info.accepted);
    const rejected = addressList(info.rejected);
    if (accepted.length === 0) return fail(`the server accepted no recipient (${info.response ?? "no response"})`);
    if (rejected.length > 0) console.error(`mail: ${label}: the server refused ${rejected.join(", ")}`);
    return { ok: true, messageId: info.messageId, accepted, rejected };
  } catch (err) {
    return fail(err instanceof Error ? err.message : String(err));
  }
}

/**
 * Sends one message through SMTP_URL from MAIL_FROM. Never throws (see sendMailVia).
 * Call it after the transaction that caused the message has committed
 * (e.g. from `transaction.afterCommit`), so a rolled-back write sends nothing.
 */
export async function sendMail(mail: OutgoingMail): Promise<MailResult> {
  let smtpUrl: string | undefined;
  try {
    smtpUrl = env().SMTP_URL;
  } catch (err) {
    const error = err instanceof Error ? err.message : String(err);
    console.error(`mail: not sent "${mail.subject}": ${error}`);
    return { ok: false, error };
  }
  return sendMailVia(smtpUrl, mail);
}
