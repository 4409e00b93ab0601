import type { Browser, Page } from "playwright-core";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import { BASE_URL, DEMO, launch, screenshot, signIn } from "./browser";

const ROWS = 20_000;

/** A temperature-like signal, one sample a second: setpoint steps with a first-order response and a little noise. */
function temperatureCsv(rows: number): string {
  let seed = 42;
  const noise = () => {
    seed = (seed * 1664525 + 1013904223) % 4294967296;
    return seed / 4294967296 - 0.5;
  };
  const start = Date.UTC(2026, 2, 2, 6, 0, 0);
  const lines = ["timestamp,value,quality"];
  let pv = 20;
  for (let i = 0; i < rows; i++) {
    const setpoint = [20, 72, 72.5, 4, 63][Math.floor(i / 4000) % 5];
    pv += (setpoint - pv) / 120;
    const quality = i % 5000 === 2500 ? "bad" : "good";
    lines.push(`${new Date(start + i * 1000).toISOString()},${(pv + noise() * 0.15).toFixed(3)},${quality}`);
  }
  return lines.join("\n") + "\n";
}

const csv = (name: string, text: string) => ({ name, mimeType: "text/csv", buffer: Buffer.from(text) });
const samplesOut = async (page: Page, output: string) => Number(((await page.getByTestId(`metrics-${output}`).locator("td").nth(1).textContent()) ?? "").replace(/,/g, ""));

describe("workbench: try a profile on sample data in the browser", () => {
  let browser: Browser;
  beforeAll(async () => {
    browser = await launch();
  });
  afterAll(async () => {
    await browser?.close();
  });

  it("previews Temperature shape on an uploaded CSV, edits the deviation in place, tunes it, and lists bad CSV lines", async () => {
    const page = await browser.newPage({ viewport: { width: 1280, height: 1000 } });
    await signIn(page, DEMO.engineer);
    await page.getByRole("link", { name: "Workbench" }).click();
    await page.waitForURL(`${BASE_URL}/workbench`);
    await page.getByRole("heading", { name: "Workbench" }).waitFor();
    // The first site in the list is the default; other tests add sites whose names sort first.
    await page.getByLabel("Site", { exact: true }).selectOption({ label: "Fenwick Creamery" });

    await page.getByLabel("Profile", { exact: true }).selectOption({ label: "Temperature shape (analog)" });
    await page.getByLabel(/^Deviation \(degC\)/).waitFor();
    // The latest revision (2) has the tighter deviation.
    expect(await page.getByLabel(/^Deviation \(degC\)/).inputValue()).toBe("0.2");
    await page.getByLabel("Sample data CSV").setInputFiles(csv("pasteuriser-sample.csv", temperatureCsv(ROWS)));

    // Metrics per output, the chart on a canvas with its text summary, and an announcement.
    const row = page.getByTestId("metrics-shape");
    await row.filter({ hasText: "20,000" }).waitFor({ timeout: 30_000 });
    const kept = await samplesOut(page, "shape");
    expect(kept).toBeGreaterThan(10);
    expect(kept).toBeLessThan(ROWS);
    expect(await row.textContent()).toMatch(/: 1/);
    const chart = page.getByTestId("preview-chart");
    expect(await chart.locator("canvas").count()).toBeGreaterThan(0);
    expect(await page.getByRole("img", { name: "Chart of the raw signal and the reduced outputs over time" }).count()).toBe(1);
    const summary = await page.getByTestId("chart-summary").textContent();
    expect(summary).toContain("Raw signal: 20,000 samples");
    expect(summary).toContain("4 bad-quality");
    expect(summary).toContain(`Output shape: ${kept.toLocaleString("en")} samples out`);
    expect(await page.getByRole("status").filter({ hasText: "Preview finished" }).textContent()).toContain(`shape keeps ${kept.toLocaleString("en")} of 20,000 samples`);
    expect(await page.getByRole("note", { name: "Reduction is lossy" }).textContent()).toContain("Regulated record");
    await screenshot(page, "workbench-preview");

    // A wider deviation, edited in place (not saved), keeps fewer samples.
    await page.getByLabel(/^Deviation \(degC\)/).fill("1");
    await page.getByRole("button", { name: "Run preview" }).click();
    await page.getByTestId("edited-note").waitFor();
    await page.waitForFunction((before) => {
      const cell = document.querySelector('[data-testid="metrics-shape"] td:nth-of-type(2)');
      return cell !== null && Number(cell.textContent!.replace(/,/g, "")) !== before;
    }, kept);
    const wider = await samplesOut(page, "shape");
    expect(wider).toBeLessThan(kept);

    // Drag across the chart to zoom in, pan, and come back to the whole series.
    const before = await chart.locator("p").first().textContent();
    await chart.locator(".u-over").scrollIntoViewIfNeeded();
    const box = (await chart.locator(".u-over").boundingBox())!;
    await page.mouse.move(box.x + box.width * 0.3, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + box.width * 0.5, box.y + box.height / 2, { steps: 5 });
    await page.mouse.up();
    await page.getByRole("button", { name: "Whole series" }).and(page.locator(":enabled")).waitFor();
    expect(await chart.locator("p").first().textContent()).not.toBe(before);
    await page.getByRole("button", { name: "Later →" }).click();
    await page.getByRole("button", { name: "Whole series" }).click();
    await page.getByRole("button", { name: "Whole series" }).and(page.locator(":disabled")).waitFor();

    // Tuning: sweep the deviation, find the setting for a bound on the error, and use it.
    await page.getByLabel("Parameter to sweep").selectOption({ label: "shape · step 2 Swinging door · Deviation (degC)" });
    await page.getByLabel("Sweep from").fill("0.05");
    await page.getByLabel("Sweep to").fill("1");
    expect(await page.getByLabel("Points", { exact: true }).inputValue()).toBe("20");
    await page.getByRole("button", { name: "Run sweep" }).click();
    await page.getByTestId("tuning-status").filter({ hasText: "Sweep finished: 20 values" }).waitFor({ timeout: 30_000 });
    expect(await page.getByRole("img", { name: /Chart of reduction ratio and max error/ }).locator("canvas").count()).toBeGreaterThan(0);
    await page.getByLabel("Goal", { exact: true }).selectOption("maxError");
    await page.getByLabel(/^Goal value/).fill("0.3");
    await page.getByRole("button", { name: "Find a setting" }).click();
    await page.getByTestId("found-setting").waitFor({ timeout: 30_000 });
    const found = await page.getByTestId("found-setting").textContent();
    expect(Number(/max error ([\d.]+)/.exec(found ?? "")?.[1])).toBeLessThanOrEqual(0.3);
    await screenshot(page, "workbench-tuning");
    await page.getByRole("button", { name: "Use this value" }).click();
    await page.waitForFunction((before) => {
      const cell = document.querySelector('[data-testid="metrics-shape"] td:nth-of-type(2)');
      return cell !== null && Number(cell.textContent!.replace(/,/g, "")) !== before;
    }, wider);
    const chosen = Number(await page.getByLabel(/^Deviation \(degC\)/).inputValue());
    expect(chosen).toBeGreaterThan(0.05);
    expect(chosen).toBeLessThan(0.35);

    // Save the samples against the pasteuriser group, load them back, and see the estimate use them.
    const sets = page.getByRole("region", { name: "Sample sets" });
    await sets.getByLabel("Group for sample sets").selectOption({ label: "pasteuriser-temperatures" });
    await sets.getByLabel("Sample set name").fill("Holding tube, morning run");
    await sets.getByRole("button", { name: "Save as sample set" }).click();
    await page.getByTestId("sample-set-status").filter({ hasText: "Saved “Holding tube, morning run” (20,000 samples)" }).waitFor();
    await sets.getByRole("button", { name: "Load Holding tube, morning run" }).click();
    await page.getByTestId("sample-summary").filter({ hasText: "sample set “Holding tube, morning run”: 20,000 samples" }).waitFor();
    await page.goto(`${BASE_URL}/sites/fenwick-creamery/estimates`);
    const estimate = page.getByTestId("estimate-pasteuriser-temperatures");
    expect(await estimate.textContent()).toContain("sample set “Holding tube, morning run”");
    expect(await estimate.textContent()).toContain("measured");
    // The assumptions are one click away.
    await page.getByText("Assumptions behind these figures").click();
    expect(await page.getByRole("list", { name: "Assumptions" }).textContent()).toContain("16 bytes");
    await screenshot(page, "estimates");
    await page.goto(`${BASE_URL}/workbench`);
    await page.getByLabel("Profile", { exact: true }).selectOption({ label: "Temperature shape (analog)" });

    // A bad CSV: the problems name their lines, and nothing is loaded from it.
    const bad = ["time,value", "2026-03-02T06:00:00Z,20.1", "2026-03-02T06:00:01Z,hot", "2026-03-02T06:00:03Z,20.3", "2026-03-02T06:00:02Z,20.4"].join("\n");
    await page.getByLabel("Sample data CSV").setInputFiles(csv("bad.csv", bad));
    const problems = page.getByRole("list", { name: "Problems in the CSV" });
    await problems.waitFor();
    const text = await problems.textContent();
    expect(text).toContain("line 3");
    expect(text).toContain("line 5");
    await screenshot(page, "workbench-bad-csv");
  });
});
