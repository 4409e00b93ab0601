import type { ReactNode } from "react";

type Props = { label: string; htmlFor: string; error?: string; hint?: ReactNode; children: ReactNode };

/** A labelled form control with its hint and error text wired for screen readers. */
export function Field({ label, htmlFor, error, hint, children }: Readonly<Props>) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={htmlFor} className="text-label font-medium text-ink-soft">
        {label}
      </label>
      {children}
      {hint && !error ? <p className="text-micro text-ink-faint">{hint}</p> : null}
      {error ? (
        <p id={`${htmlFor}-error`} role="alert" className="text-micro text-fault">
          {error}
        </p>
      ) : null}
    </div>
  );
}

export const inputClass =
  "rounded-panel border border-panel-line bg-panel px-2.5 py-1.5 text-body min-h-9 aria-[invalid=true]:border-fault";
