"use client";

import { usePathname, useRouter } from "next/navigation";

type Props = { sites: { slug: string; name: string }[] };

/** Jumps to a site's page; shows the site the current page belongs to. */
export function SiteSwitcher({ sites }: Readonly<Props>) {
  const router = useRouter();
  const pathname = usePathname();
  const current = /^\/sites\/([^/]+)/.exec(pathname)?.[1] ?? "";
  return (
    <label className="flex items-center gap-2 text-label text-ink-soft">
      <span className="sr-only md:not-sr-only">Site</span>
      <select
        aria-label="Switch site"
        className="rounded-panel border border-panel-line bg-panel px-2 py-1.5 min-h-9 max-w-56"
        value={current}
        onChange={(e) => router.push(e.target.value ? `/sites/${e.target.value}` : "/sites")}
      >
        <option value="">All sites</option>
        {sites.map((s) => (
          <option key={s.slug} value={s.slug}>
            {s.name}
          </option>
        ))}
      </select>
    </label>
  );
}
