"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

const TABS = [
  { path: "", label: "Summary" },
  { path: "/tags", label: "Tags" },
  { path: "/groups", label: "Groups" },
  { path: "/assignments", label: "Assignments" },
  { path: "/coverage", label: "Coverage" },
  { path: "/estimates", label: "Estimates" },
  { path: "/draft", label: "Draft change" },
  { path: "/releases", label: "Releases" },
];

/** The sections of one site. */
export function SiteTabs({ slug }: Readonly<{ slug: string }>) {
  const pathname = usePathname();
  const base = `/sites/${slug}`;
  return (
    <nav aria-label="Site sections" className="mb-6 border-b border-panel-line">
      <ul className="-mb-px flex gap-1 overflow-x-auto">
        {TABS.map((t) => {
          const href = base + t.path;
          const active = t.path === "" ? pathname === base : pathname.startsWith(href);
          return (
            <li key={t.label}>
              <Link
                href={href}
                aria-current={active ? "page" : undefined}
                className={`block whitespace-nowrap border-b-2 px-3 py-2 text-label font-medium ${
                  active ? "border-weir-600 text-weir-700" : "border-transparent text-ink-soft hover:text-ink"
                }`}
              >
                {t.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
