import { beforeAll, describe, expect, it, vi } from "vitest";

vi.mock("server-only", () => ({}));

// The links in mail use PUBLIC_URL before NEXTAUTH_URL; env() reads them once.
beforeAll(() => {
  vi.stubEnv("PUBLIC_URL", "https://sluice.example.test/");
  vi.stubEnv("NEXTAUTH_URL", "http://localhost:3000");
});

const load = () => import("@/lib/mail/messages");
const site = { name: "Fenwick Creamery", slug: "fenwick-creamery" };

describe("review workflow messages", () => {
  it("link to the console at PUBLIC_URL, or to the url given", async () => {
    const { reviewRequestedMail, releasedMail } = await load();
    expect(reviewRequestedMail({ site, changeId: 7, by: "Eli" }).text).toContain("https://sluice.example.test/sites/fenwick-creamery/changes/7\n");
    expect(releasedMail({ site, release: 3, by: "Rui", url: "https://x.test/r/3" }).text).toContain("https://x.test/r/3\n");
  });

  it("keep subjects on one line whatever the names hold", async () => {
    const { changeApprovedMail } = await load();
    const m = changeApprovedMail({ site: { name: "Evil\r\nBcc: someone@else.test", slug: "evil" }, changeId: 1, by: "Rui\nReviewer" });
    expect(m.subject).toBe("[Sluice] Approved: change #1 at Evil Bcc: someone@else.test");
    expect(m.text.startsWith("Rui Reviewer approved change #1 at Evil Bcc: someone@else.test (evil).")).toBe(true);
  });

  it("say when a rejection or an urgent rollback came without a reason", async () => {
    const { changeRejectedMail, rolledBackMail } = await load();
    expect(changeRejectedMail({ site, changeId: 2, by: "Rui", comment: " " }).text).toContain("No reason was given.");
    const urgent = rolledBackMail({ site, release: 9, restores: 7, by: "Ada", urgent: true, reason: "" });
    expect(urgent.subject).toMatch(/^\[Sluice\] URGENT rollback:/);
    expect(urgent.text).toContain("(no reason was recorded)");
  });

  it("quote multi-line comments and count gateways", async () => {
    const { releasedMail } = await load();
    const one = releasedMail({ site, release: 5, by: "Rui", gateways: 1, comment: "first\nsecond" });
    expect(one.text).toContain("Bundles were issued for 1 gateway;");
    expect(one.text).toContain("Comment:\n  first\n  second");
    expect(one.text.endsWith("— Sluice\n")).toBe(true);
  });
});
