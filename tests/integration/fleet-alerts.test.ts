import { randomUUID } from "node:crypto";
import { beforeAll, describe, expect, it } from "vitest";
import type { Actor } from "@/lib/auth/guard";
import { sweepGatewayAlerts, type SweepResult } from "@/lib/data/fleet-alerts";
import { getCaughtMail, listCaughtMail } from "@/lib/mail/caught";
import { Gateway, type Site } from "@/models";
import { createGateway, createSite, createUser } from "../factories";

// Sweeps with injected times and reads the mail back from the SMTP catcher the test stack
// runs (as mail.test.ts does). The sweep looks at every gateway in the database, so each
// test names its own site and gateways and looks only at those.

const NOW = new Date(Math.floor(Date.now() / 1000) * 1000);
const at = (s: number) => new Date(NOW.getTime() + s * 1000);

let admin: Actor;
const people: Record<string, string> = {};

beforeAll(async () => {
  const a = await createUser({ role: "admin" });
  admin = { id: a.id, email: a.email, name: a.name, role: "admin" };
  people.admin = a.email;
  people.reviewer = (await createUser({ role: "reviewer" })).email;
  people.inactive = (await createUser({ role: "reviewer", active: false })).email;
  people.engineer = (await createUser({ role: "engineer" })).email;
  people.viewer = (await createUser({ role: "viewer" })).email;
});

async function fleetSite(): Promise<Site> {
  return createSite({ name: `Alert plant ${randomUUID().slice(0, 8)}` });
}

/** Every caught message whose subject names the gateway (or the site, for several), with its text. */
async function caughtAbout(text: string) {
  const { messages } = await listCaughtMail(admin, { pageSize: 200 });
  const hits = messages.filter((m) => m.subject.includes(text));
  return Promise.all(hits.map(async (m) => (await getCaughtMail(admin, m.id))!));
}

/** Sets a gateway's columns in the database, as the check-in write path would (whatever the instance holds). */
const record = (g: Gateway, values: Partial<Pick<Gateway, "lastCheckInAt" | "lastStatus" | "lastMessage" | "failingSince" | "failureMailedAt" | "staleMailedAt">>) =>
  Gateway.update(values, { where: { id: g.id } });

const mailedFor = (results: SweepResult[], slug: string) => results.flatMap((r) => r.mailed.filter((m) => m.gateways.includes(slug)));

async function failing(site: Site, message = "bundle schema check failed: groups[0].outputs is empty"): Promise<Gateway> {
  const g = await createGateway(site);
  await g.update({ lastCheckInAt: at(-10), lastStatus: "failed", lastMessage: message, failingSince: at(-10), runningRelease: 3 });
  return g;
}

describe("gateway alerts", () => {
  it("mails reviewers and admins once when a gateway fails; a second sweep sends nothing", async () => {
    const site = await fleetSite();
    const g = await failing(site);
    const first = await sweepGatewayAlerts(NOW);
    expect(mailedFor([first], g.slug)).toEqual([{ kind: "failing", site: site.slug, gateways: [g.slug], sent: true }]);
    await g.reload();
    expect(g.failureMailedAt).toEqual(NOW);
    expect(g.staleMailedAt).toBeNull();

    const [mail] = await caughtAbout(g.slug);
    expect(mail.subject).toBe(`[Sluice] Gateway failing: ${g.slug} at ${site.name}`);
    expect(mail.to).toEqual(expect.arrayContaining([people.admin, people.reviewer]));
    for (const who of ["inactive", "engineer", "viewer"]) expect(mail.to).not.toContain(people[who]);
    expect(mail.text).toContain(`${g.name} (${g.slug})`);
    expect(mail.text).toContain("  bundle schema check failed: groups[0].outputs is empty");
    expect(mail.text).toContain("It last reported running release 3.");
    expect(mail.text).toContain("may still be forwarding with its last good bundle");
    expect(mail.text).toMatch(new RegExp(`/fleet\\?site=${site.slug}&state=failing`));

    const second = await sweepGatewayAlerts(at(60));
    expect(mailedFor([second], g.slug)).toEqual([]);
    expect(await caughtAbout(g.slug)).toHaveLength(1);
  });

  it("mails once when two sweeps run at the same time (two app instances)", async () => {
    const site = await fleetSite();
    const g = await failing(site);
    const results = await Promise.all([sweepGatewayAlerts(NOW), sweepGatewayAlerts(NOW)]);
    expect(mailedFor(results, g.slug)).toHaveLength(1);
    expect(await caughtAbout(g.slug)).toHaveLength(1);
  });

  it("mails once when a gateway goes stale after three missed polls, not before", async () => {
    const site = await fleetSite();
    const g = await createGateway(site);
    await g.update({ lastCheckInAt: at(-180), lastStatus: "running", runningRelease: 2 });
    expect(mailedFor([await sweepGatewayAlerts(NOW)], g.slug)).toEqual([]);
    const late = await sweepGatewayAlerts(at(1));
    expect(mailedFor([late], g.slug)).toEqual([{ kind: "stale", site: site.slug, gateways: [g.slug], sent: true }]);
    expect(mailedFor([await sweepGatewayAlerts(at(600))], g.slug)).toEqual([]);
    const mails = await caughtAbout(g.slug);
    expect(mails).toHaveLength(1);
    expect(mails[0].subject).toBe(`[Sluice] Gateway stale: ${g.slug} at ${site.name}`);
    expect(mails[0].text).toContain(`last check-in ${at(-180).toISOString().replace("T", " ").replace(".000Z", " UTC")}`);
    expect(mails[0].text).toContain("polls every 60 s");
    expect(mails[0].text).toMatch(new RegExp(`/fleet\\?site=${site.slug}&state=stale`));
  });

  it("never mails about a gateway that has not checked in yet", async () => {
    const site = await fleetSite();
    const g = await createGateway(site);
    expect(mailedFor([await sweepGatewayAlerts(at(86_400))], g.slug)).toEqual([]);
  });

  it("puts the gateways of one site that fail together in one message", async () => {
    const site = await fleetSite();
    const a = await failing(site, "first");
    const b = await failing(site, "second");
    const result = await sweepGatewayAlerts(NOW);
    expect(result.mailed.filter((m) => m.site === site.slug)).toEqual([{ kind: "failing", site: site.slug, gateways: [a.slug, b.slug].sort((x, y) => (x < y ? -1 : 1)), sent: true }]);
    const mails = await caughtAbout(site.name);
    expect(mails.map((m) => m.subject)).toEqual([`[Sluice] 2 gateways failing at ${site.name}`]);
    expect(mails[0].text).toContain("  first");
    expect(mails[0].text).toContain("  second");
  });

  it("re-arms after a good check-in: the next failure and the next silence mail again", async () => {
    const site = await fleetSite();
    const g = await failing(site);
    await sweepGatewayAlerts(NOW);
    // A good check-in, as the check-in write path records it.
    await record(g, { lastCheckInAt: at(30), lastStatus: "running", lastMessage: null, failingSince: null, failureMailedAt: null, staleMailedAt: null });
    expect(mailedFor([await sweepGatewayAlerts(at(40))], g.slug)).toEqual([]);
    await record(g, { lastCheckInAt: at(90), lastStatus: "failed", lastMessage: "again", failingSince: at(90) });
    expect(mailedFor([await sweepGatewayAlerts(at(100))], g.slug)).toEqual([{ kind: "failing", site: site.slug, gateways: [g.slug], sent: true }]);
    // Silent since its last report: stale once, and again after the next check-in and silence.
    expect(mailedFor([await sweepGatewayAlerts(at(300))], g.slug)).toEqual([{ kind: "stale", site: site.slug, gateways: [g.slug], sent: true }]);
    await record(g, { lastCheckInAt: at(400), lastStatus: "running", failureMailedAt: null, staleMailedAt: null });
    expect(mailedFor([await sweepGatewayAlerts(at(500))], g.slug)).toEqual([]);
    expect(mailedFor([await sweepGatewayAlerts(at(600))], g.slug)).toEqual([{ kind: "stale", site: site.slug, gateways: [g.slug], sent: true }]);
    const subjects = (await caughtAbout(g.slug)).map((m) => m.subject).sort();
    expect(subjects).toEqual([
      `[Sluice] Gateway failing: ${g.slug} at ${site.name}`,
      `[Sluice] Gateway failing: ${g.slug} at ${site.name}`,
      `[Sluice] Gateway stale: ${g.slug} at ${site.name}`,
      `[Sluice] Gateway stale: ${g.slug} at ${site.name}`,
    ]);
  });
});
