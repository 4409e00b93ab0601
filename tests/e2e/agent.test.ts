import { execFile } from "node:child_process";
import fs from "node:fs";
import os from "node:os";
import path from "node:path";
import { promisify } from "node:util";
import { parse } from "yaml";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, signIn, signInOverHttp } from "./browser";

const SITE = "fenwick-creamery";
const GATEWAY = "fw-gw-01";

/** 600 s at 1 Hz for each tag: a slow wave with a little noise, good quality (ISO times, UTC). */
function inputCsv(tags: string[], start: number): { text: string; rows: number } {
  let text = "tag,time,value,quality\n";
  let rows = 0;
  let seed = 7;
  const noise = () => ((seed = (seed * 48271) % 2147483647) / 2147483647 - 0.5) * 0.05;
  for (let i = 0; i < 600; i++) {
    const time = new Date(start + i * 1000).toISOString();
    for (const [k, tag] of tags.entries()) {
      text += `${tag},${time},${(50 + 5 * k + 8 * Math.sin(i / 90 + k) + noise()).toFixed(3)},0\n`;
      rows++;
    }
    if (i % 60 === 0) {
      text += `E2E/NOT-IN-INVENTORY/PV,${time},1,0\n`;
      rows++;
    }
  }
  return { text, rows };
}

type Bundle = { release: number; groups: { tags: string[]; outputs?: { steps: { method: string }[] }[] }[] };
const ANALOG_METHODS = new Set(["swinging-door", "deadband", "aggregate"]);

describe("the reference gateway agent against the running registry", () => {
  let dir: string;
  let admin: string;
  let tokenId: string | undefined;

  beforeAll(async () => {
    dir = fs.mkdtempSync(path.join(os.tmpdir(), "sluice-agent-e2e-"));
    admin = await signInOverHttp(DEMO.admin);
  });
  afterAll(async () => {
    if (tokenId) await fetch(`${BASE_URL}/api/sites/${SITE}/gateways/${GATEWAY}/tokens/${tokenId}`, { method: "DELETE", headers: { cookie: admin } });
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it("pulls the demo gateway's bundle with a new token, reduces a CSV, and its check-in shows in the fleet", { timeout: 180_000 }, async () => {
    const issued = await fetch(`${BASE_URL}/api/sites/${SITE}/gateways/${GATEWAY}/tokens`, {
      method: "POST",
      headers: { cookie: admin, "content-type": "application/json" },
      body: JSON.stringify({ label: "e2e reference agent" }),
    });
    expect(issued.status).toBe(201);
    const { id, token, prefix } = (await issued.json()) as { id: string; token: string; prefix: string };
    tokenId = String(id);
    expect(token.startsWith(prefix)).toBe(true);
    const bearer = { authorization: `Bearer ${token}` };

    // The operator's out-of-band step: the trust file is the registry's published key list.
    const keys = await fetch(`${BASE_URL}/api/gateway/v1/signing-key`, { headers: bearer });
    expect(keys.status).toBe(200);
    fs.writeFileSync(path.join(dir, "trust.json"), await keys.text());
    fs.writeFileSync(path.join(dir, "token"), `${token}\n`);

    // Tags to send: those of groups whose steps suit analog samples.
    const pulled = await fetch(`${BASE_URL}/api/gateway/v1/bundle`, { headers: bearer });
    expect(pulled.status).toBe(200);
    const bundle = parse(await pulled.text()) as Bundle;
    const tags = bundle.groups
      .filter((g) => g.outputs?.every((o) => o.steps.some((s) => ANALOG_METHODS.has(s.method))))
      .flatMap((g) => g.tags.slice(0, 3))
      .slice(0, 12);
    expect(tags.length).toBeGreaterThan(0);
    const input = inputCsv(tags, Date.now() - 900_000);
    fs.writeFileSync(path.join(dir, "in.csv"), input.text);

    const args = ["tsx", "scripts/agent.ts", "--url", BASE_URL, "--token-file", path.join(dir, "token"), "--state-dir", path.join(dir, "state")];
    const files = ["--input", path.join(dir, "in.csv"), "--output", path.join(dir, "out.csv"), "--trust", path.join(dir, "trust.json")];
    const result = await promisify(execFile)("npx", [...args, ...files], { cwd: process.cwd(), timeout: 120_000 }).catch((e) => e);
    expect(result.stderr ?? "").not.toContain(token);
    expect(result.code ?? 0, `agent stderr:\n${result.stderr}`).toBe(0);

    const lines = fs.readFileSync(path.join(dir, "out.csv"), "utf8").trimEnd().split("\n");
    expect(lines[0]).toBe("tag,output,time,value,quality");
    expect(lines.length - 1).toBeGreaterThan(0);
    expect(lines.length - 1).toBeLessThan(input.rows);

    const fleet = await fetch(`${BASE_URL}/api/fleet?site=${SITE}`, { headers: { cookie: admin } });
    expect(fleet.status).toBe(200);
    const { gateways } = (await fleet.json()) as { gateways: { site: string; slug: string; runningRelease: number | null; unknownTags: string[] }[] };
    const gw = gateways.find((g) => g.site === SITE && g.slug === GATEWAY);
    const ran = JSON.parse(fs.readFileSync(path.join(dir, "state", "bundle.json"), "utf8")) as { release: number };
    expect(ran.release).toBeGreaterThanOrEqual(bundle.release);
    expect(gw?.runningRelease).toBe(ran.release);
    expect(gw?.unknownTags).toContain("E2E/NOT-IN-INVENTORY/PV");

    // The fleet page shows what the agent said it runs.
    const browser = await launch();
    try {
      const page = await browser.newPage();
      await signIn(page, DEMO.viewer);
      await page.goto(`${BASE_URL}/fleet?site=${SITE}`);
      const row = page.getByTestId(`gateway-${SITE}-${GATEWAY}`);
      expect(await row.getByTestId("running-release").textContent()).toContain(`release ${ran.release}`);
      expect(await row.locator("[data-state]").getAttribute("data-state")).toBe("current");
    } finally {
      await browser.close();
    }
  });
});
