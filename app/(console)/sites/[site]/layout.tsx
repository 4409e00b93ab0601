import Link from "next/link";
import { PageHeader } from "@/components/shell/page-header";
import { SiteTabs } from "@/components/sites/site-tabs";
import { currentActor } from "@/lib/auth/guard";
import { draftSummary } from "@/lib/data/drafts";
import { getSite } from "@/lib/data/sites";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string }>; children: React.ReactNode };

export default async function SiteLayout({ params, children }: Readonly<Props>) {
  const { site: slug } = await params;
  const actor = await currentActor();
  const site = await orNotFound(getSite(actor, slug));
  const draft = await draftSummary(actor, slug);
  return (
    <>
      <PageHeader
        title={site.name}
        crumbs={[{ href: "/", label: "Overview" }, { href: "/sites", label: "Sites" }, { label: site.name }]}
        actions={
          draft.edits.length > 0 ? (
            <Link
              href={`/sites/${site.slug}/draft`}
              data-testid="draft-badge"
              className="rounded-panel border border-caution bg-caution-soft px-3 py-1.5 text-label font-medium"
            >
              Draft change · {draft.edits.length} edit{draft.edits.length === 1 ? "" : "s"} not yet released
            </Link>
          ) : null
        }
      />
      <SiteTabs slug={site.slug} />
      {children}
    </>
  );
}
