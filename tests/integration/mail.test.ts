import net from "node:net";
import { renderToStaticMarkup } from "react-dom/server";
import { afterEach, beforeAll, describe, expect, it, vi } from "vitest";
import MailPage from "@/app/(console)/admin/mail/page";
import { Forbidden } from "@/components/shell/forbidden";
import type { Actor } from "@/lib/auth/guard";
import { env } from "@/lib/env";
import { getCaughtMail, listCaughtMail, loadMailAdmin, mailDelivery } from "@/lib/mail/caught";
import { changeApprovedMail, changeRejectedMail, releasedMail, reviewRequestedMail, rolledBackMail, type BuiltMail } from "@/lib/mail/messages";
import { sendMail, sendMailVia } from "@/lib/mail/send";
import { actAs, createUser } from "../factories";

// Sends through the SMTP catcher that scripts/stack.mjs starts for the tests
// (SMTP_URL, SLUICE_MAIL_DIR) and reads every message back from its store.

const site = { name: "Fenwick Creamery", slug: "fenwick-creamery" };
const stamp = Date.now().toString(36);
const addr = (who: string) => `${who}-${stamp}@test.invalid`;

let admin: Actor;

beforeAll(async () => {
  const user = await createUser({ role: "admin" });
  admin = { id: user.id, email: user.email, name: user.name, role: "admin" };
});

afterEach(() => vi.restoreAllMocks());

/** The one caught message with this subject, with its parsed text. */
async function caught(subject: string) {
  const { messages } = await listCaughtMail(admin, { pageSize: 200 });
  const hits = messages.filter((m) => m.subject === subject);
  expect(hits, `exactly one caught message titled ${subject}`).toHaveLength(1);
  const message = await getCaughtMail(admin, hits[0].id);
  expect(message).not.toBeNull();
  return message!;
}

/** A loopback port with nothing listening on it. */
function closedPort(): Promise<number> {
  return new Promise((resolve) => {
    const srv = net.createServer().listen(0, "127.0.0.1", () => {
      const { port } = srv.address() as net.AddressInfo;
      srv.close(() => resolve(port));
    });
  });
}

describe("mail through the catcher", () => {
  it("runs against the catcher the test stack started", () => {
    expect(env().SMTP_URL).toMatch(/^smtp:\/\/127\.0\.0\.1:\d+$/);
    expect(mailDelivery()).toMatchObject({ kind: "catcher", server: expect.stringMatching(/^127\.0\.0\.1:\d+$/) });
  });

  const cases: [string, string[], BuiltMail, RegExp[]][] = [
    [
      "review requested",
      [addr("rui"), addr("rita")],
      reviewRequestedMail({ site, changeId: 41, by: `Eli Engineer ${stamp}`, note: "Tighter deadband on the\npasteuriser temperatures" }),
      [/Eli Engineer \w+ submitted change #41 at Fenwick Creamery \(fenwick-creamery\) for review/, /  Tighter deadband on the\n  pasteuriser temperatures/, /\/sites\/fenwick-creamery\/changes\/41/],
    ],
    [
      "approved",
      [addr("eli")],
      changeApprovedMail({ site, changeId: 41, by: `Rui Reviewer ${stamp}`, comment: "Error stays within 0.2 degC." }),
      [/Rui Reviewer \w+ approved change #41/, /ready to release/, /Error stays within 0\.2 degC\./],
    ],
    [
      "rejected",
      [addr("eli")],
      changeRejectedMail({ site, changeId: 42, by: `Rui Reviewer ${stamp}`, comment: "RMSE doubles on TT-102." }),
      [/rejected change #42/, /back in draft/, /Reason:\n  RMSE doubles on TT-102\./],
    ],
    [
      "released",
      [addr("eli"), addr("rui")],
      releasedMail({ site, release: 14, changeId: 41, gateways: 3, by: `Rui Reviewer ${stamp}` }),
      [/released release 14 of Fenwick Creamery \(fenwick-creamery\) from change #41/, /3 gateways/, /\/sites\/fenwick-creamery\/releases\/14/],
    ],
    [
      "rolled back (urgent)",
      [addr("rui"), addr("rita")],
      rolledBackMail({ site, release: 15, restores: 12, by: `Ada Admin ${stamp}`, urgent: true, reason: "Gateways drop samples since release 14." }),
      [/rolled Fenwick Creamery \(fenwick-creamery\) back to the configuration of release 12/, /urgent rollback, released without a second person's approval/, /Reason given:\n  Gateways drop samples since release 14\./],
    ],
  ];

  for (const [name, to, built, expected] of cases) {
    it(`sends the ${name} message and reads it back`, async () => {
      const subject = `${built.subject} ${stamp}`;
      const result = await sendMail({ to, subject, text: built.text });
      expect(result).toMatchObject({ ok: true, accepted: to, rejected: [] });
      const message = await caught(subject);
      expect(message.to).toEqual(to);
      expect(message.headerTo).toBe(to.join(", "));
      expect(message.from).toContain("sluice@localhost");
      expect(message.text).toBe(built.text.trimEnd());
      for (const re of expected) expect(message.text).toMatch(re);
    });
  }

  it("says URGENT in the subject of an urgent rollback only", () => {
    const urgent = rolledBackMail({ site, release: 15, restores: 12, by: "Ada", urgent: true, reason: "r" });
    const planned = rolledBackMail({ site, release: 16, restores: 12, by: "Rui", reason: "Planned" });
    expect(urgent.subject).toBe("[Sluice] URGENT rollback: Fenwick Creamery back to release 12 (as release 15)");
    expect(planned.subject).toBe("[Sluice] Rolled back: Fenwick Creamery back to release 12 (as release 16)");
    expect(planned.text).not.toMatch(/urgent/i);
  });

  it("lists newest first, pages, and refuses ids that are not message ids", async () => {
    for (const n of [1, 2, 3]) expect((await sendMail({ to: [addr("pager")], subject: `paging ${n} ${stamp}`, text: `n=${n}` })).ok).toBe(true);
    const first = await listCaughtMail(admin, { page: 1, pageSize: 2 });
    expect(first.messages.map((m) => m.subject)).toEqual([`paging 3 ${stamp}`, `paging 2 ${stamp}`]);
    expect(first.total).toBeGreaterThanOrEqual(3);
    const second = await listCaughtMail(admin, { page: 2, pageSize: 2 });
    expect(second.messages[0].subject).toBe(`paging 1 ${stamp}`);
    expect(await getCaughtMail(admin, "../index.jsonl")).toBeNull();
    expect(await getCaughtMail(admin, "20990101T000000000Z-00000000")).toBeNull();
  });
});

describe("when mail cannot be sent", () => {
  it("returns a failure and logs it, without throwing, when the server's port is closed", async () => {
    const log = vi.spyOn(console, "error").mockImplementation(() => undefined);
    const port = await closedPort();
    const result = await sendMailVia(`smtp://127.0.0.1:${port}`, { to: [addr("nobody")], subject: "never delivered", text: "x" });
    expect(result).toMatchObject({ ok: false, error: expect.stringMatching(/ECONNREFUSED|connect/i) });
    expect(log).toHaveBeenCalledWith(expect.stringContaining('mail: not sent "never delivered"'));
  });

  it("returns a failure for no server and for no recipients", async () => {
    vi.spyOn(console, "error").mockImplementation(() => undefined);
    expect(await sendMailVia(undefined, { to: [addr("x")], subject: "s", text: "t" })).toMatchObject({ ok: false, error: expect.stringContaining("SMTP_URL") });
    expect(await sendMail({ to: [" "], subject: "s", text: "t" })).toEqual({ ok: false, error: "no recipients" });
  });
});

describe("the Mail admin page", () => {
  it("refuses its data to everyone but admins", async () => {
    await expect(loadMailAdmin(null)).rejects.toMatchObject({ status: 401 });
    for (const role of ["viewer", "engineer", "reviewer"] as const) {
      const user = await createUser({ role });
      const actor: Actor = { id: user.id, email: user.email, name: user.name, role };
      await expect(loadMailAdmin(actor)).rejects.toMatchObject({ status: 403 });
      await expect(listCaughtMail(actor)).rejects.toMatchObject({ status: 403 });
      await expect(getCaughtMail(actor, "x")).rejects.toMatchObject({ status: 403 });
    }
  });

  it("gives admins the delivery, the list and the opened message", async () => {
    const subject = `open me ${stamp}`;
    await sendMail({ to: [addr("ada")], subject, text: "Line one\nLine two" });
    const id = (await listCaughtMail(admin)).messages.find((m) => m.subject === subject)!.id;
    const data = await loadMailAdmin(admin, { message: id });
    expect(data.delivery.kind).toBe("catcher");
    expect(data.list.messages.some((m) => m.id === id)).toBe(true);
    expect(data.selected).toMatchObject({ id, subject, text: "Line one\nLine two" });
    expect((await loadMailAdmin(admin, { message: "gone-00000000" })).missing).toBe(true);
  });

  it("renders Forbidden for a reviewer and the page for an admin", async () => {
    const reviewer = await createUser({ role: "reviewer" });
    await actAs(reviewer);
    const refused = await MailPage({ searchParams: Promise.resolve({}) });
    expect(refused.type).toBe(Forbidden);
    const adminUser = await createUser({ role: "admin" });
    await actAs(adminUser);
    const subject = `rendered ${stamp}`;
    await sendMail({ to: [addr("ada")], subject, text: "Shown in the detail view" });
    const id = (await listCaughtMail(admin)).messages.find((m) => m.subject === subject)!.id;
    const shown = await MailPage({ searchParams: Promise.resolve({ message: id }) });
    expect(shown.type).not.toBe(Forbidden);
    const html = renderToStaticMarkup(shown);
    expect(html).toContain("caught by the local mail catcher");
    expect(html).toContain(`href="/admin/mail?message=${id}"`);
    expect(html).toContain("Shown in the detail view");
    await actAs(null);
  });
});
