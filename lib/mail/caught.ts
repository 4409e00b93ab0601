import "server-only";
import fs from "node:fs/promises";
import path from "node:path";
import { simpleParser, type AddressObject } from "mailparser";
import { z } from "zod";
import type { Actor } from "@/lib/auth/guard";
import { assertCan } from "@/lib/data/access";
import { env } from "@/lib/env";
import { describeSmtpUrl } from "./send";

// Reads the store of scripts/smtp-catcher.mjs (SLUICE_MAIL_DIR): <id>.eml per message and
// index.jsonl with one summary line per message. Administrators only.

export type CaughtMailSummary = { id: string; receivedAt: string; from: string; to: string[]; subject: string; size: number };
export type CaughtMail = CaughtMailSummary & { headerTo: string; cc: string; date: string | null; text: string };
export type CaughtMailPage = { messages: CaughtMailSummary[]; total: number; page: number; pageSize: number; pages: number };

/** Where outgoing mail goes: the local catcher (readable here), a real server, or nowhere. */
export type MailDelivery =
  | { kind: "catcher"; dir: string; server: string | null }
  | { kind: "server"; server: string }
  | { kind: "none" };

const ID = /^[A-Za-z0-9-]{1,80}$/;

const summarySchema = z.object({
  id: z.string().regex(ID),
  receivedAt: z.string(),
  from: z.string().default(""),
  to: z.array(z.string()).default([]),
  subject: z.string().default(""),
  size: z.number().default(0),
});

const pageQuery = z.object({
  page: z.coerce.number().int().min(1).catch(1),
  pageSize: z.coerce.number().int().min(1).max(200).catch(50),
});

/** Where mail goes, from SMTP_URL and SLUICE_MAIL_DIR (no credentials shown). */
export function mailDelivery(): MailDelivery {
  const { SMTP_URL, SLUICE_MAIL_DIR } = env();
  const server = SMTP_URL ? describeSmtpUrl(SMTP_URL) : null;
  if (SLUICE_MAIL_DIR) return { kind: "catcher", dir: path.resolve(SLUICE_MAIL_DIR), server };
  if (server) return { kind: "server", server };
  return { kind: "none" };
}

/** Every caught message in a store directory, newest first. Lines that do not parse are skipped. */
export async function readCaughtIndex(dir: string): Promise<CaughtMailSummary[]> {
  let raw: string;
  try {
    raw = await fs.readFile(path.join(dir, "index.jsonl"), "utf8");
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "ENOENT") return [];
    throw err;
  }
  const out: CaughtMailSummary[] = [];
  for (const line of raw.split("\n")) {
    if (!line.trim()) continue;
    try {
      const parsed = summarySchema.safeParse(JSON.parse(line));
      if (parsed.success) out.push(parsed.data);
    } catch {
      // A line still being written, or damaged by hand: leave it out.
    }
  }
  // Newest first; messages received in the same millisecond keep the catcher's order, reversed.
  return out
    .map((m, i) => ({ m, i }))
    .sort((a, b) => b.m.receivedAt.localeCompare(a.m.receivedAt) || b.i - a.i)
    .map(({ m }) => m);
}

const addressText = (a: AddressObject | AddressObject[] | undefined) => (Array.isArray(a) ? a.map((x) => x.text).join(", ") : (a?.text ?? ""));

/** One caught message from a store directory with its parsed text, or null when it is not there. */
export async function readCaughtMessage(dir: string, id: string): Promise<CaughtMail | null> {
  if (!ID.test(id)) return null;
  const summary = (await readCaughtIndex(dir)).find((m) => m.id === id);
  if (!summary) return null;
  let eml: Buffer;
  try {
    eml = await fs.readFile(path.join(dir, `${id}.eml`));
  } catch (err) {
    if ((err as NodeJS.ErrnoException).code === "ENOENT") return null;
    throw err;
  }
  const parsed = await simpleParser(eml, { skipImageLinks: true, skipTextLinks: true });
  return {
    ...summary,
    subject: parsed.subject ?? summary.subject,
    headerTo: addressText(parsed.to),
    cc: addressText(parsed.cc),
    date: parsed.date ? parsed.date.toISOString() : null,
    text: (parsed.text ?? "").replace(/\s+$/, ""),
  };
}

function storeDir(): string | null {
  const d = mailDelivery();
  return d.kind === "catcher" ? d.dir : null;
}

/** Caught messages, newest first, paged (`page` from 1, `pageSize` up to 200). Admins only. */
export async function listCaughtMail(actor: Actor | null, query: Record<string, unknown> = {}): Promise<CaughtMailPage> {
  assertCan(actor, "fleet.admin");
  const { page, pageSize } = pageQuery.parse({ page: query.page ?? 1, pageSize: query.pageSize ?? 50 });
  const dir = storeDir();
  const all = dir ? await readCaughtIndex(dir) : [];
  const pages = Math.max(1, Math.ceil(all.length / pageSize));
  return { messages: all.slice((page - 1) * pageSize, page * pageSize), total: all.length, page, pageSize, pages };
}

/** One caught message with its text, or null. Admins only. */
export async function getCaughtMail(actor: Actor | null, id: string): Promise<CaughtMail | null> {
  assertCan(actor, "fleet.admin");
  const dir = storeDir();
  return dir ? readCaughtMessage(dir, id) : null;
}

export type MailAdminData = { delivery: MailDelivery; list: CaughtMailPage; selected: CaughtMail | null; missing: boolean };

/** Everything the Mail admin page shows: delivery, one page of messages, the open message. Admins only. */
export async function loadMailAdmin(actor: Actor | null, query: { page?: string; message?: string } = {}): Promise<MailAdminData> {
  assertCan(actor, "fleet.admin");
  const [list, selected] = await Promise.all([
    listCaughtMail(actor, { page: query.page }),
    query.message ? getCaughtMail(actor, query.message) : Promise.resolve(null),
  ]);
  return { delivery: mailDelivery(), list, selected, missing: Boolean(query.message) && !selected };
}
