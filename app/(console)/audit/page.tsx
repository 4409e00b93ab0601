import Link from "next/link";
import { AuditDiff } from "@/components/audit/audit-diff";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { FilterForm, FilterInput, FilterSelect } from "@/components/ui/filter-form";
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
      <FilterForm action="/audit" label="Filter the audit log" columns="sm:grid-cols-3 lg:grid-cols-6" filtered={FILTERS.some((f) => query[f])}>
        <FilterSelect label="Site" name="site" value={query.site} anyLabel="any site" options={sites.map((s) => ({ value: s.slug, label: s.name }))} />
        <FilterSelect label="User" name="user" value={query.user} anyLabel="anyone" options={facets.users} />
        <FilterSelect label="Action" name="action" value={query.action} anyLabel="any action" options={facets.actions} />
        <FilterInput label="From (UTC)" name="from" type="datetime-local" value={query.from} />
        <FilterInput label="To (UTC)" name="to" type="datetime-local" value={query.to} />
      </FilterForm>
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
