"use client";

import { useId, useRef, useState, type ReactNode } from "react";
import { toast } from "sonner";
import { Button } from "./button";
import { inputClass } from "./field";

type Props = {
  label: string;
  secret: string;
  onDone: () => void;
  /** What to do with the secret; the default says it is shown once and only a hash is kept. */
  note?: ReactNode;
  testId?: string;
  className?: string;
};

/**
 * Shows a secret once, in a read-only field with a copy button; it lives only in the page's
 * memory and is not stored anywhere it could be shown again. Without clipboard access (a
 * plain-http console, for one) the copy button selects the field for Ctrl+C instead.
 */
export function SecretReveal({ label, secret, onDone, note, testId = "secret-value", className = "" }: Readonly<Props>) {
  const id = useId();
  const field = useRef<HTMLInputElement>(null);
  const [copied, setCopied] = useState(false);
  async function copy() {
    try {
      await navigator.clipboard.writeText(secret);
      setCopied(true);
    } catch {
      field.current?.select();
      toast.message("Selected: press Ctrl+C (⌘C) to copy it.");
    }
  }
  return (
    <div role="status" className={`rounded-panel border border-caution bg-caution-soft p-4 ${className}`}>
      <label htmlFor={id} className="text-label font-medium">
        {label}
      </label>
      <p className="mt-1 text-micro text-ink-soft">
        {note ?? (
          <>
            <strong className="font-medium text-caution">Shown only now.</strong> Copy it and hand it over by a safe channel; Sluice keeps only a hash.
          </>
        )}
      </p>
      <div className="mt-2 flex flex-wrap items-center gap-2">
        <input
          ref={field}
          id={id}
          data-testid={testId}
          readOnly
          value={secret}
          spellCheck={false}
          autoComplete="off"
          onFocus={(e) => e.currentTarget.select()}
          className={`${inputClass} min-w-0 flex-1 font-mono sm:min-w-[30rem]`}
        />
        <Button tone="quiet" onClick={copy}>
          {copied ? "Copied" : "Copy"}
        </Button>
        <Button tone="quiet" onClick={onDone}>
          Done
        </Button>
      </div>
    </div>
  );
}
