"use client";

import { useId, useState } from "react";
import type { BundleDiff } from "@/lib/bundles/diff";
import { SideBySideDiff, UnifiedDiff } from "./diff-tables";

export type GatewayDiff = {
  gateway: string;
  diff: BundleDiff | null;
  /** The bundle bytes are identical. */
  unchanged?: boolean;
  /** Only the release number and issue time differ (what the gateway does is the same). */
  contentSame?: boolean;
  /** The gateway has no bundle on the later side. */
  removed?: boolean;
};

type Layout = "unified" | "side";

function Counts({ diff }: Readonly<{ diff: BundleDiff }>) {
  return (
    <span className="text-micro text-ink-soft">
      <span className="text-ok">+{diff.added}</span> added, <span className="text-fault">−{diff.removed}</span> removed
    </span>
  );
}

/** One gateway's bundle diff, or why there is none. */
function GatewayBlock({ g, layout, beforeLabel, openFolded }: Readonly<{ g: GatewayDiff; layout: Layout; beforeLabel: string; openFolded: boolean }>) {
  const label = `${layout === "unified" ? "Unified" : "Side-by-side"} diff for ${g.gateway}`;
  const view = g.diff ? layout === "unified" ? <UnifiedDiff diff={g.diff} label={label} /> : <SideBySideDiff diff={g.diff} label={label} /> : null;
  let status: React.ReactNode = null;
  if (g.removed) status = <span className="text-micro font-medium text-fault">no bundle on the later side (gateway removed)</span>;
  else if (!g.diff || g.unchanged || (g.diff.added === 0 && g.diff.removed === 0)) status = <span className="text-micro font-medium text-ink-soft">no change</span>;
  else if (g.diff.unified.includes("\n--- /dev/null\n")) status = <span className="text-micro font-medium text-weir-700">first bundle — no {beforeLabel} to compare with</span>;
  else if (g.contentSame) status = <span className="text-micro font-medium text-ink-soft">no change in content — only the release number and issue time differ</span>;
  const showFolded = g.contentSame && !g.diff?.unified.includes("\n--- /dev/null\n");
  const changed = !!g.diff && !g.removed && !g.unchanged && (g.diff.added > 0 || g.diff.removed > 0);
  return (
    <section aria-label={`Gateway ${g.gateway}`} data-testid={`gateway-diff-${g.gateway}`} className="rounded-panel border border-panel-line bg-panel">
      <header className="flex flex-wrap items-baseline justify-between gap-2 border-b border-panel-line px-3 py-2">
        <h4 className="font-mono text-label font-medium">{g.gateway}</h4>
        <span className="flex flex-wrap items-baseline gap-3">
          {status}
          {changed && g.diff ? <Counts diff={g.diff} /> : null}
        </span>
      </header>
      {changed ? (
        showFolded ? (
          <details className="px-3 py-2" open={openFolded}>
            <summary className="cursor-pointer text-label">Show the lines that differ</summary>
            {view}
          </details>
        ) : (
          <div className="py-1">{view}</div>
        )
      ) : null}
    </section>
  );
}

type Props = {
  gateways: GatewayDiff[];
  /** What the left side is, in words ("current release"). */
  beforeLabel?: string;
  /** Show the lines of content-same gateways at once instead of folded. */
  openFolded?: boolean;
};

/** Per-gateway bundle diffs with one switch between unified and side-by-side layouts. */
export function GatewayDiffs({ gateways, beforeLabel = "earlier bundle", openFolded = false }: Readonly<Props>) {
  const [layout, setLayout] = useState<Layout>("unified");
  const name = useId();
  if (gateways.length === 0) return <p className="text-label text-ink-soft">The site has no gateways, so there are no bundles.</p>;
  return (
    <div className="flex flex-col gap-3">
      <fieldset className="flex flex-wrap items-center gap-3 text-label">
        <legend className="sr-only">Diff layout</legend>
        <span className="font-medium text-ink-soft" aria-hidden="true">
          Layout
        </span>
        {(["unified", "side"] as const).map((l) => (
          <label key={l} className="flex items-center gap-1.5">
            <input type="radio" name={name} value={l} checked={layout === l} onChange={() => setLayout(l)} />
            {l === "unified" ? "Unified" : "Side by side"}
          </label>
        ))}
        <span className="text-micro text-ink-faint">Added lines are marked +, removed lines −; unchanged stretches are folded.</span>
      </fieldset>
      {gateways.map((g) => (
        <GatewayBlock key={g.gateway} g={g} layout={layout} beforeLabel={beforeLabel} openFolded={openFolded} />
      ))}
    </div>
  );
}
