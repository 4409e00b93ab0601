import Link from "next/link";
import { AuditDiff } from "@/components/audit/audit-diff";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { inputClass } from "@/components/ui/field";
import { currentActor } from "@/lib/auth/guard";
import { auditFacets, listAudit } from "@/lib/data/audit";
import { listSites } from "@/lib/data/sites";
import { HttpError } from "@/lib/http";

export const metadata = { title: "Audit log" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const FILTERS = ["site", "user", "action", "from", "to"] as const;

export default async function AuditPage({ searchParams }: Readonly<Props>) {
  const raw = await searchParams;
  const query = Object.fromEntries(Object.entries(raw).map(([k, v]) => [k, Array.isArray(v) ? v[0] : v]).filter(([, v]) => v));
  const actor = await currentActor();
  const [sites, facets] = await Promise.all([listSites(actor), auditFacets(actor)]);
  let page;
  let problem: string | null = null;
  try {
    page = await listAudit(actor, query);
  } catch (e) {
    if (!(e instanceof Error) || !("issues" in e || e instanceof HttpError)) throw e;
    problem = "Some filters are not valid: give times such as 2026-12-01T08:00Z, with from before to.";
    page = await listAudit(actor, {});
  }
  const link = (p: number) => {
    const params = new URLSearchParams(Object.entries({ ...query, page: String(p) }) as [string, string][]);
    return `/audit?${params.toString()}`;
  };
  return (
    <>
      <PageHeader
        title="Audit log"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Audit log" }]}
        lead="Every write, with who made it, when, and the record before and after."
      />
      <form method="get" className="mb-4 grid gap-3 rounded-panel border border-panel-line bg-panel p-4 sm:grid-cols-3 lg:grid-cols-6 lg:items-end" aria-label="Filter the audit log">
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          Site
          <select name="site" defaultValue={query.site ?? ""} className={inputClass}>
            <option value="">any site</option>
            {sites.map((s) => (
              <option key={s.slug} value={s.slug}>
                {s.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          User
          <select name="user" defaultValue={query.user ?? ""} className={inputClass}>
            <option value="">anyone</option>
            {facets.users.map((u) => (
              <option key={u} value={u}>
                {u}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          Action
          <select name="action" defaultValue={query.action ?? ""} className={inputClass}>
            <option value="">any action</option>
            {facets.actions.map((a) => (
              <option key={a} value={a}>
                {a}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          From (UTC)
          <input type="datetime-local" name="from" defaultValue={query.from ?? ""} className={inputClass} />
        </label>
        <label className="flex flex-col gap-1 text-label text-ink-soft">
          To (UTC)
          <input type="datetime-local" name="to" defaultValue={query.to ?? ""} className={inputClass} />
        </label>
        <div className="flex gap-2">
          <button type="submit" className="min-h-9 rounded-panel bg-weir-600 px-3 text-label font-medium text-white hover:bg-weir-700">
            Filter
          </button>
          {FILTERS.some((f) => query[f]) ? (
            <Link href="/audit" className="min-h-9 rounded-panel border border-panel-line px-3 py-2 text-label">
              Clear
            </Link>
          ) : null}
        </div>
      </form>
      {problem ? (
        <p role="alert" className="mb-4 rounded-panel bg-caution-soft px-3 py-2 text-label">
          {problem}
        </p>
      ) : null}
      {page.entries.length === 0 ? (
        <EmptyState title="No entries match">Writes appear here as soon as they are made. Widen the filters to see more.</EmptyState>
      ) : (
        <>
          <p className="mb-2 text-label text-ink-faint" data-testid="audit-count">
            {page.total} {page.total === 1 ? "entry" : "entries"} · page {page.page} of {page.pages}
          </p>
          <ol className="flex flex-col gap-2" aria-label="Audit entries">
            {page.entries.map((e) => (
              <li key={e.id} className="rounded-panel border border-panel-line bg-panel px-3 py-2">
                <details>
                  <summary className="flex cursor-pointer flex-wrap items-baseline gap-x-3 gap-y-1 text-label">
                    <time dateTime={e.at} className="font-mono text-micro text-ink-faint">
                      {e.at.replace("T", " ").replace(/\.\d+Z$/, "Z")}
                    </time>
                    <span className="font-medium">{e.action}</span>
                    <span className="font-mono">{e.entityLabel}</span>
                    {e.siteSlug ? <span className="text-ink-faint">at {e.siteSlug}</span> : null}
                    <span className="text-ink-soft">by {e.actorEmail}</span>
                  </summary>
                  <div className="mt-2">
                    <AuditDiff before={e.before} after={e.after} />
                  </div>
                </details>
              </li>
            ))}
          </ol>
          <nav aria-label="Audit pages" className="mt-4 flex items-center gap-3 text-label">
            {page.page > 1 ? (
              <Link href={link(page.page - 1)} className="text-weir-600 underline">
                Newer
              </Link>
            ) : null}
            {page.page < page.pages ? (
              <Link href={link(page.page + 1)} className="text-weir-600 underline">
                Older
              </Link>
            ) : null}
          </nav>
        </>
      )}
    </>
  );
}
