"use client";

import { useId, useRef, useState, type ReactNode } from "react";
import { Button } from "./button";

type Props = {
  label: string;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  tone?: "danger" | "primary";
  onConfirm: () => Promise<boolean>;
};

/** A button that asks first, in a modal dialog (Escape cancels, focus stays inside). */
export function ConfirmButton({ label, title, children, confirmLabel, tone = "danger", onConfirm }: Readonly<Props>) {
  const dialog = useRef<HTMLDialogElement>(null);
  const [busy, setBusy] = useState(false);
  const headingId = useId();
  return (
    <>
      <Button tone={tone === "danger" ? "quiet" : "primary"} className={tone === "danger" ? "text-fault" : ""} onClick={() => dialog.current?.showModal()}>
        {label}
      </Button>
      <dialog ref={dialog} aria-labelledby={headingId} className="m-auto w-full max-w-md rounded-panel bg-panel p-0 shadow-xl backdrop:bg-ink/40">
        <div className="p-5">
          <h2 id={headingId} className="text-title">
            {title}
          </h2>
          <div className="mt-2 text-ink-soft">{children}</div>
          <div className="mt-5 flex justify-end gap-2">
            <Button tone="quiet" onClick={() => dialog.current?.close()} autoFocus>
              Cancel
            </Button>
            <Button
              tone={tone}
              disabled={busy}
              onClick={async () => {
                setBusy(true);
                const done = await onConfirm();
                setBusy(false);
                if (done) dialog.current?.close();
              }}
            >
              {busy ? "Working…" : confirmLabel}
            </Button>
          </div>
        </div>
      </dialog>
    </>
  );
}
