// Long tasks while scrolling the tag inventory of a 50,000-tag site top to bottom in
// headless Chromium, measured with a PerformanceObserver for "longtask" entries (tasks
// over 50 ms). Reference in the same run: the same scroll over a plain, non-virtual HTML
// table of the same 50,000 rows. Each figure comes with the machine's load average and the
// renderer's CPU time per frame, since the machine may be shared; TAG_BENCH_ROUNDS (default 2)
// rounds of both. Run by `npm run bench` or `npm run bench -- tags` (scripts/stack.mjs starts a
// throwaway database and a production server and passes their URLs). For diagnosis:
// TAG_BENCH_TRACE=dir saves a DevTools trace of each Sluice scroll, TAG_BENCH_PROFILE=dir a V8
// CPU profile of the page, TAG_BENCH_JS_FLAGS passes V8 flags (e.g. a deoptimisation log).
import { writeFileSync } from "node:fs";
import { cpus, loadavg } from "node:os";
import type { CDPSession, Page } from "playwright-core";
import { DEMO, launch, signIn } from "../tests/e2e/browser";
import { Sequelize, QueryTypes } from "sequelize";

const DB = process.env.DATABASE_URL!;
const BASE = process.env.SLUICE_E2E_URL!;
const N = 50_000;
const SLUG = "bench-50k";
// Two speeds per animation frame: 600 px (about 17 rows, a very fast wheel or trackpad
// flick, 36,000 px/s at 60 frames/s) and 1,800 px (50 rows, dragging the scroll thumb).
const STEPS_PX = [600, 1800];
const ROUNDS = Number(process.env.TAG_BENCH_ROUNDS ?? 2);

async function seedSite() {
  const db = new Sequelize(DB, { logging: false, dialectOptions: { bigIntAsNumber: true, insertIdAsNumber: true } });
  const now = new Date();
  await db.query(
    "INSERT IGNORE INTO sites (slug, name, time_zone, uplink_budget_kbps, storage_price_per_gb_month, retention_months, created_at, updated_at) VALUES (?, 'Bench plant (50,000 tags)', 'UTC', 1000, 0.02, 12, ?, ?)",
    { replacements: [SLUG, now, now] },
  );
  const [site] = await db.query<{ id: number }>("SELECT id FROM sites WHERE slug = ?", { replacements: [SLUG], type: QueryTypes.SELECT });
  await db.query("INSERT IGNORE INTO gateways (site_id, slug, name, created_at, updated_at) VALUES (?, 'bench-gw-01', 'Bench gateway', ?, ?)", {
    replacements: [site.id, now, now],
  });
  const [gw] = await db.query<{ id: number }>("SELECT id FROM gateways WHERE slug = 'bench-gw-01'", { type: QueryTypes.SELECT });
  const kinds = ["analog", "discrete", "counter"];
  for (let start = 0; start < N; start += 5000) {
    const values: unknown[] = [];
    const rows: string[] = [];
    for (let i = start; i < Math.min(N, start + 5000); i++) {
      const kind = kinds[i % 3];
      rows.push("(?,?,?,?,?,?,?,?,?,?,?,?)");
      values.push(site.id, gw.id, `AREA${i % 40}/TT-${String(i).padStart(5, "0")}/PV`, kind === "analog" ? "degC" : kind === "counter" ? "m3" : "state", 1000, kind,
        kind === "analog" ? 0 : null, kind === "analog" ? 150 : null, `AREA${i % 40}`, `EQ-${i % 500}`, now, now);
    }
    await db.query(
      `INSERT IGNORE INTO tags (site_id, gateway_id, name, unit, sample_period_ms, kind, eu_low, eu_high, area, equipment, created_at, updated_at) VALUES ${rows.join(",")}`,
      { replacements: values },
    );
  }
  await db.close();
}

// Always traced: "toplevel" (each task, with its wall and thread CPU time); with
// TAG_BENCH_TRACE=dir also what DevTools needs to show the scroll, saved there.
const TRACE_TOPLEVEL = ["toplevel"];
const TRACE_DEVTOOLS = ["toplevel", "devtools.timeline", "v8.execute", "blink.user_timing"];

type Scroll = {
  longTasks: number;
  maxMs: number;
  totalMs: number;
  frames: number;
  seconds: number;
  load: number;
  cpuMs: number;
  /** Main-thread tasks that used over 50 ms of CPU time, and the most any task used. */
  cpuLongTasks: number;
  maxCpuMs: number;
};

// In-page code as plain text: the TypeScript runner would otherwise wrap named functions
// with a helper that does not exist inside the page.
const SCROLL_SCRIPT = `async (sel, STEP) => {
  const el = document.querySelector(sel);
  el.scrollTop = 0;
  await new Promise((r) => setTimeout(r, 500));
  const tasks = [];
  const obs = new PerformanceObserver((list) => list.getEntries().forEach((e) => tasks.push(e.duration)));
  obs.observe({ type: "longtask" });
  const t0 = performance.now();
  let frames = 0;
  await new Promise((resolve) => {
    const step = () => {
      frames++;
      el.scrollTop += STEP;
      if (el.scrollTop + el.clientHeight >= el.scrollHeight - 1) resolve();
      else requestAnimationFrame(step);
    };
    requestAnimationFrame(step);
  });
  await new Promise((r) => setTimeout(r, 300));
  obs.disconnect();
  return {
    longTasks: tasks.length,
    maxMs: tasks.length ? Math.max(...tasks) : 0,
    totalMs: tasks.reduce((a, b) => a + b, 0),
    frames,
    seconds: (performance.now() - t0) / 1000,
  };
}`;

type TraceEvent = { ph: string; name: string; pid: number; tid: number; tdur?: number; args?: { name?: string } };

/**
 * The page's main-thread tasks from a trace, by their thread CPU time: a task that waited for a
 * core (the machine being busy with other work) is long in wall time only. The page's main
 * thread is the renderer main thread that used the most CPU in tasks.
 */
function mainThreadTasks(trace: Buffer): { cpuLongTasks: number; maxCpuMs: number } {
  const events = (JSON.parse(trace.toString("utf8")) as { traceEvents: TraceEvent[] }).traceEvents;
  const mains = new Set(events.filter((e) => e.ph === "M" && e.name === "thread_name" && e.args?.name === "CrRendererMain").map((e) => `${e.pid}:${e.tid}`));
  const tasks = new Map<string, number[]>();
  for (const e of events) {
    const thread = `${e.pid}:${e.tid}`;
    if (e.ph !== "X" || !e.name.endsWith("RunTask") || !mains.has(thread)) continue;
    let list = tasks.get(thread);
    if (!list) tasks.set(thread, (list = []));
    list.push((e.tdur ?? 0) / 1000);
  }
  const sum = (xs: number[]) => xs.reduce((a, b) => a + b, 0);
  const page = [...tasks.values()].sort((a, b) => sum(b) - sum(a))[0] ?? [];
  return { cpuLongTasks: page.filter((ms) => ms > 50).length, maxCpuMs: page.reduce((a, b) => Math.max(a, b), 0) };
}

/** CPU seconds used so far by each renderer process (all its threads), by process id. */
async function rendererCpu(cdp: CDPSession): Promise<Map<number, number>> {
  const { processInfo } = (await cdp.send("SystemInfo.getProcessInfo")) as { processInfo: { type: string; id: number; cpuTime: number }[] };
  return new Map(processInfo.filter((p) => p.type === "renderer").map((p) => [p.id, p.cpuTime]));
}

/**
 * Waits (up to 20 s) until the renderers together use under 5 % of a core over a quarter
 * second, so that a scroll does not start on top of a page's load or garbage collection.
 */
async function settle(cdp: CDPSession): Promise<void> {
  const end = Date.now() + 20_000;
  let before = await rendererCpu(cdp);
  while (Date.now() < end) {
    await new Promise((r) => setTimeout(r, 250));
    const after = await rendererCpu(cdp);
    let used = 0;
    for (const [id, t] of after) used += t - (before.get(id) ?? 0);
    if (used < 0.0125) return;
    before = after;
  }
}

/**
 * Scrolls `selector` from top to bottom, `step` px per frame, and collects long tasks meanwhile.
 * `load` is the machine's 1-minute load average at the end, `cpuMs` the CPU time of the busiest
 * renderer meanwhile (the page's), and the trace gives each main-thread task's CPU time: both
 * are inflated far less than wall time by other work on a shared machine.
 */
async function scrollAndMeasure(page: Page, cdp: CDPSession, selector: string, step: number, tracePath?: string, profilePath?: string): Promise<Scroll> {
  const browser = page.context().browser()!;
  await browser.startTracing(page, { path: tracePath, categories: tracePath ? TRACE_DEVTOOLS : TRACE_TOPLEVEL });
  // TAG_BENCH_PROFILE=dir: a V8 CPU profile of the page during the scroll (slows it down).
  const profiler = profilePath ? await page.context().newCDPSession(page) : undefined;
  if (profiler) {
    await profiler.send("Profiler.enable");
    await profiler.send("Profiler.setSamplingInterval", { interval: 200 });
    await profiler.send("Profiler.start");
  }
  const before = await rendererCpu(cdp);
  const s = (await page.evaluate(`(${SCROLL_SCRIPT})(${JSON.stringify(selector)}, ${step})`)) as Omit<Scroll, "load" | "cpuMs" | "cpuLongTasks" | "maxCpuMs">;
  const after = await rendererCpu(cdp);
  if (profiler && profilePath) {
    const { profile } = (await profiler.send("Profiler.stop")) as { profile: unknown };
    writeFileSync(profilePath, JSON.stringify(profile));
    await profiler.detach();
  }
  const tasks = mainThreadTasks(await browser.stopTracing());
  const cpuMs = Math.max(...[...after].map(([id, t]) => 1000 * (t - (before.get(id) ?? 0))));
  return { ...s, load: loadavg()[0], cpuMs, ...tasks };
}

async function main() {
  await seedSite();
  // TAG_BENCH_JS_FLAGS: V8 flags for the page (for instance a deoptimisation log), for diagnosis.
  const browser = await launch(process.env.TAG_BENCH_JS_FLAGS ? [`--js-flags=${process.env.TAG_BENCH_JS_FLAGS}`] : []);
  const page = await browser.newPage({ viewport: { width: 1400, height: 900 } });
  await signIn(page, DEMO.admin);
  console.log("tag-table bench: signed in; loading the 50,000-tag inventory");
  const t0 = Date.now();
  await page.goto(`${BASE}/sites/${SLUG}/tags`);
  await page.getByTestId("tag-count").filter({ hasText: `${N.toLocaleString("en")} of ${N.toLocaleString("en")} tags` }).waitFor({ timeout: 120_000 });
  const loadSeconds = (Date.now() - t0) / 1000;
  await page.waitForTimeout(500);
  console.log(`tag-table bench: loaded in ${loadSeconds.toFixed(1)} s`);
  const appDom = (await page.evaluate(`document.querySelectorAll('[data-testid="tag-scroller"] [role="row"]').length`)) as number;

  // Reference: the same rows as a plain table, every row in the DOM.
  const rows: string[] = [];
  for (let offset = 0; ; offset += 20000) {
    const res = await page.request.get(`${BASE}/api/sites/${SLUG}/tags?offset=${offset}&limit=20000`);
    const body = (await res.json()) as { tags: Record<string, unknown>[]; total: number };
    for (const t of body.tags) rows.push(`<tr><td>${t.name}</td><td>${t.unit}</td><td>${t.samplePeriodMs}</td><td>${t.kind}</td><td>${t.area}</td><td>${t.equipment}</td><td>${t.gateway}</td></tr>`);
    if (offset + body.tags.length >= body.total) break;
  }
  const plainHtml = `<div id="s" style="height:65vh;overflow:auto"><table>${rows.join("")}</table></div>`;

  // Rounds of both scrolls, the two tables alternating: on a shared machine, what else runs
  // changes from minute to minute, and each figure is printed with the load it ran under.
  // The plain table lives in its own page only while it is measured: left open, its renderer
  // collects the garbage of a 50,000-row document for seconds at a time (seen in a trace:
  // 9 s of major GC during one Sluice scroll), taking a core from whichever page scrolls.
  // Before each scroll the browser is left to go quiet.
  const cdp = await browser.newBrowserCDPSession();
  const trace = process.env.TAG_BENCH_TRACE;
  const profile = process.env.TAG_BENCH_PROFILE;
  const results: { round: number; step: number; app: Scroll; plain: Scroll }[] = [];
  let refLoad = 0;
  for (let round = 1; round <= ROUNDS; round++) {
    for (const step of STEPS_PX) {
      console.log(`tag-table bench: round ${round} of ${ROUNDS}, ${step} px/frame`);
      await settle(cdp);
      // TAG_BENCH_TRACE=dir: a Chromium performance trace of each Sluice scroll, for DevTools.
      const app = await scrollAndMeasure(page, cdp, '[data-testid="tag-scroller"]', step, trace && `${trace}/tag-table-${step}px-${round}.json`, profile && `${profile}/tag-table-${step}px-${round}.cpuprofile`);
      const ref = await browser.newPage({ viewport: { width: 1400, height: 900 } });
      const t1 = Date.now();
      await ref.setContent(plainHtml, { timeout: 180_000 });
      refLoad = (Date.now() - t1) / 1000;
      await settle(cdp);
      const plain = await scrollAndMeasure(ref, cdp, "#s", step);
      await ref.close();
      results.push({ round, step, app, plain });
    }
  }
  await browser.close();

  const cols = ["long", "max ms", "total ms", "CPU>50", "max CPU", "frames", "scroll s", "CPU ms/fr", "page s", "DOM rows", "loadavg"];
  const line = (name: string, s: Scroll, pageLoad: number, dom: number) =>
    [
      name.padEnd(40),
      ...[s.longTasks, s.maxMs.toFixed(0), s.totalMs.toFixed(0), s.cpuLongTasks, s.maxCpuMs.toFixed(0), s.frames, s.seconds.toFixed(2), (s.cpuMs / s.frames).toFixed(1), pageLoad.toFixed(2), dom, s.load.toFixed(2)].map((v, i) =>
        String(v).padStart(cols[i].length + 1),
      ),
    ].join(" ");
  console.log(`\nTag inventory scroll, ${N.toLocaleString("en")} rows, headless Chromium, ${cpus().length} cores (long task = over 50 ms)`);
  console.log(`${"".padEnd(40)} ${cols.map((c) => c.padStart(c.length + 1)).join(" ")}`);
  for (const r of results) {
    console.log(line(`Sluice tag table, ${r.step} px/frame, round ${r.round}`, r.app, loadSeconds, appDom));
    console.log(line(`plain table, ${r.step} px/frame, round ${r.round}`, r.plain, refLoad, rows.length));
  }
  for (const r of results) {
    const a = r.app;
    console.log(
      `target at ${r.step} px/frame, round ${r.round}: no long task while scrolling → ${a.longTasks === 0 ? "met" : `NOT met (${a.longTasks} long tasks, longest ${a.maxMs.toFixed(0)} ms)`} (1-min load average ${a.load.toFixed(2)}); ` +
        `${a.cpuLongTasks} task${a.cpuLongTasks === 1 ? "" : "s"} used over 50 ms of main-thread CPU (most: ${a.maxCpuMs.toFixed(0)} ms)`,
    );
  }
  console.log("long, max ms, total ms: long tasks by wall time (PerformanceObserver), what the target counts; a task waiting for a core counts too.");
  console.log("CPU>50, max CPU: the same tasks by main-thread CPU time (trace). CPU ms/fr: CPU time of the page's renderer process (all threads) per frame.");
  console.log("page s: seconds to load the page (Sluice: all pages of the inventory; plain: setContent). loadavg: 1-minute load average after the scroll.");
}

main().catch((e) => {
  console.error(e);
  process.exit(1);
});
