import Link from "next/link";
import { notFound } from "next/navigation";
import { CompareForm } from "@/components/profiles/compare-form";
import { LineDiff } from "@/components/profiles/line-diff";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { diffRevisions, getProfile } from "@/lib/data/profiles";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ profileId: string }>; searchParams: Promise<Record<string, string | string[] | undefined>> };

const revisionParam = (v: string | string[] | undefined) => {
  const n = Number(Array.isArray(v) ? v[0] : v);
  return Number.isInteger(n) && n > 0 ? n : null;
};

export default async function CompareRevisionsPage({ params, searchParams }: Readonly<Props>) {
  const { profileId } = await params;
  const id = Number(profileId);
  if (!Number.isInteger(id) || id <= 0) notFound();
  const query = await searchParams;
  const actor = await currentActor();
  const profile = await orNotFound(getProfile(actor, id));
  const numbers = profile.revisions.map((r) => r.number);
  const to = revisionParam(query.to) ?? profile.latestRevision;
  const from = revisionParam(query.from) ?? (numbers.find((n) => n < to) ?? to);
  const known = numbers.includes(from) && numbers.includes(to);
  const diff = known ? await diffRevisions(actor, id, from, to) : null;
  const noteOf = (n: number) => profile.revisions.find((r) => r.number === n)?.note;
  return (
    <>
      <PageHeader
        title={`Compare revisions of ${profile.name}`}
        crumbs={[{ href: "/", label: "Overview" }, { href: "/profiles", label: "Profiles" }, { href: `/profiles/${id}`, label: profile.name }, { label: "Compare" }]}
      />
      <div className="mb-6 rounded-panel border border-panel-line bg-panel p-4">
        <CompareForm profileId={id} revisions={numbers} from={known ? from : (numbers[1] ?? numbers[0])} to={known ? to : numbers[0]} />
      </div>
      {!diff ? (
        <p role="alert" className="rounded-panel bg-caution-soft px-3 py-2 text-label">
          This profile has revisions {numbers.slice().reverse().join(", ")}; choose two of them.
        </p>
      ) : (
        <>
          <section aria-labelledby="summary-heading" className="mb-6">
            <h2 id="summary-heading" className="mb-2">
              Revision {diff.from} → revision {diff.to}
            </h2>
            <dl className="mb-3 grid gap-1 text-label sm:grid-cols-[auto_1fr] sm:gap-x-3">
              <dt className="text-ink-faint">r{diff.from} note</dt>
              <dd>{noteOf(diff.from) || "—"}</dd>
              <dt className="text-ink-faint">r{diff.to} note</dt>
              <dd>{noteOf(diff.to) || "—"}</dd>
            </dl>
            {diff.summary.length === 0 ? (
              <p className="text-label text-ink-soft">{diff.from === diff.to ? "That is the same revision twice." : "The two revisions have the same outputs, steps and parameters."}</p>
            ) : (
              <ul className="list-disc pl-5" aria-label="Changes in words">
                {diff.summary.map((line, i) => (
                  <li key={i}>{line}</li>
                ))}
              </ul>
            )}
          </section>
          <section aria-labelledby="lines-heading">
            <div className="mb-2 flex flex-wrap items-baseline justify-between gap-2">
              <h2 id="lines-heading">Line by line</h2>
              <p className="text-micro text-ink-faint">
                <span className="font-mono">+</span> in revision {diff.to} only · <span className="font-mono">−</span> in revision {diff.from} only ·{" "}
                <a href={`/api/profiles/${id}/export?revision=${diff.from}`} download className="text-weir-700 underline">
                  YAML of r{diff.from}
                </a>{" "}
                ·{" "}
                <a href={`/api/profiles/${id}/export?revision=${diff.to}`} download className="text-weir-700 underline">
                  YAML of r{diff.to}
                </a>
              </p>
            </div>
            <LineDiff lines={diff.lines} from={diff.from} to={diff.to} />
          </section>
        </>
      )}
      <p className="mt-6 text-label">
        <Link href={`/profiles/${id}`} className="text-weir-700 underline">
          Back to {profile.name}
        </Link>
      </p>
    </>
  );
}
