import type { ReactNode } from "react";

/** What is missing and what to do next. */
export function EmptyState({ title, children }: Readonly<{ title: string; children?: ReactNode }>) {
  return (
    <div className="rounded-panel border border-dashed border-panel-line bg-panel px-6 py-10 text-center">
      <p className="text-lead font-medium">{title}</p>
      {children ? <div className="mt-2 text-ink-soft">{children}</div> : null}
    </div>
  );
}
