import Link from "next/link";
import { CompareForm } from "@/components/releases/compare-form";
import { GatewayDiffs } from "@/components/review/gateway-diffs";
import { differsOnlyInStamp } from "@/components/review/stamp-lines";
import { currentActor } from "@/lib/auth/guard";
import { HttpError } from "@/lib/http";
import { compareReleases, listReleases } from "@/lib/data/releases";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string }>; searchParams: Promise<{ from?: string; to?: string }> };

const asNumber = (s: string | undefined) => (s && /^\d+$/.test(s) ? Number(s) : null);

export default async function CompareReleasesPage({ params, searchParams }: Readonly<Props>) {
  const { site } = await params;
  const q = await searchParams;
  const actor = await currentActor();
  const releases = await orNotFound(listReleases(actor, site));
  const from = asNumber(q.from);
  const to = asNumber(q.to);
  let result: Awaited<ReturnType<typeof compareReleases>> | null = null;
  let problem: string | null = from === null || to === null ? "Choose two releases to compare." : null;
  if (!problem) {
    try {
      result = await compareReleases(actor, site, from!, to!);
    } catch (e) {
      if (!(e instanceof HttpError) || e.status !== 404) throw e;
      problem = `Cannot compare: ${e.message}.`;
    }
  }
  const gateways = result?.gateways.map((g) => ({ ...g, contentSame: differsOnlyInStamp(g.diff) })) ?? [];
  const missing = gateways.filter((g) => g.diff?.unified.includes("\n--- /dev/null\n")).map((g) => g.gateway);
  const differing = gateways.filter((g) => !missing.includes(g.gateway) && (g.removed || (g.diff && (g.diff.added || g.diff.removed) && !g.contentSame))).length;
  return (
    <section aria-labelledby="compare-heading" className="flex flex-col gap-4">
      <div>
        <nav aria-label="Breadcrumb" className="mb-1 text-micro text-ink-faint">
          <Link href={`/sites/${site}/releases`} className="hover:underline">
            Releases
          </Link>{" "}
          › Compare
        </nav>
        <h2 id="compare-heading">{result ? `Release ${result.from} → release ${result.to}` : "Compare releases"}</h2>
      </div>
      <CompareForm key={`${from}-${to}`} site={site} numbers={releases.map((r) => r.number)} from={from ?? undefined} to={to ?? undefined} />
      {problem ? (
        <p role="alert" className="text-label text-fault">
          {problem}
        </p>
      ) : null}
      {result ? (
        <>
          <p className="text-label text-ink-soft" data-testid="compare-verdict">
            {differing === 0
              ? `${missing.length ? "Every other" : "Every"} gateway's bundle has the same content in both releases; only the release number and issue time differ.`
              : `${differing} of ${gateways.length} gateway${gateways.length === 1 ? "" : "s"} get different content.`}
            {missing.length ? ` Release ${result.from} has no stored bundle for ${missing.join(", ")}, so ${missing.length === 1 ? "that bundle is" : "those bundles are"} shown in full.` : null}
          </p>
          <GatewayDiffs gateways={gateways} beforeLabel={`bundle in release ${result.from}`} openFolded />
        </>
      ) : null}
    </section>
  );
}
