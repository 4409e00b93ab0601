"use client";

import { useState } from "react";
import { Button } from "./button";

/** Shows a secret once, with a copy button; it is not stored anywhere it could be shown again. */
export function SecretReveal({ label, secret, onDone }: Readonly<{ label: string; secret: string; onDone: () => void }>) {
  const [copied, setCopied] = useState(false);
  return (
    <div role="status" className="rounded-panel border border-caution bg-caution-soft p-4">
      <p className="text-label font-medium">{label}</p>
      <p className="mt-1 text-micro text-ink-soft">Shown once. Copy it now and hand it over by a safe channel; Sluice keeps only a hash.</p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <code data-testid="secret-value" className="rounded bg-panel px-2 py-1 font-mono text-body">
          {secret}
        </code>
        <Button
          tone="quiet"
          onClick={async () => {
            await navigator.clipboard?.writeText(secret).catch(() => undefined);
            setCopied(true);
          }}
        >
          {copied ? "Copied" : "Copy"}
        </Button>
        <Button tone="quiet" onClick={onDone}>
          Done
        </Button>
      </div>
    </div>
  );
}
