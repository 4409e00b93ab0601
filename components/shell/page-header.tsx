import Link from "next/link";
import type { ReactNode } from "react";

type Crumb = { href?: string; label: string };
type Props = { title: string; crumbs?: Crumb[]; actions?: ReactNode; lead?: ReactNode };

/** Title, breadcrumbs and the page's main actions. */
export function PageHeader({ title, crumbs = [], actions, lead }: Readonly<Props>) {
  return (
    <header className="mb-6 flex flex-col gap-2">
      {crumbs.length > 0 ? (
        <nav aria-label="Breadcrumb">
          <ol className="flex flex-wrap items-center gap-1 text-micro text-ink-faint">
            {crumbs.map((c, i) => (
              <li key={`${c.label}-${i}`} className="flex items-center gap-1">
                {c.href ? (
                  <Link href={c.href} className="hover:text-weir-600 underline-offset-2 hover:underline">
                    {c.label}
                  </Link>
                ) : (
                  <span aria-current="page">{c.label}</span>
                )}
                {i < crumbs.length - 1 ? <span aria-hidden>›</span> : null}
              </li>
            ))}
          </ol>
        </nav>
      ) : null}
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h1>{title}</h1>
        {actions ? <div className="flex flex-wrap gap-2">{actions}</div> : null}
      </div>
      {lead ? <div className="max-w-3xl text-ink-soft">{lead}</div> : null}
    </header>
  );
}
