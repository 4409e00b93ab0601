import Link from "next/link";
import { when } from "@/components/review/change-status";
import { fmtBytes } from "@/components/estimates/format";
import type { ReleaseView } from "@/lib/data/releases";

/** The bundle downloads of one release, one per gateway, with short digests. */
function Bundles({ site, r }: Readonly<{ site: string; r: ReleaseView }>) {
  if (r.bundles.length === 0) return <span className="text-ink-faint">no stored bundles</span>;
  return (
    <ul className="flex flex-col gap-0.5" aria-label={`Bundles of release ${r.number}`}>
      {r.bundles.map((b) => (
        <li key={b.gateway} className="whitespace-nowrap">
          <a
            href={`/api/sites/${site}/releases/${r.number}/bundles/${encodeURIComponent(b.gateway)}`}
            download
            aria-label={`${b.gateway} bundle of release ${r.number} (YAML, ${fmtBytes(b.size)})`}
            className="font-mono text-weir-700 hover:underline"
          >
            {b.gateway}
          </a>{" "}
          <code title={`SHA-256 ${b.digest}`} className="text-micro text-ink-faint">
            {b.digest.slice(0, 12)}…
          </code>
        </li>
      ))}
    </ul>
  );
}

/** Every release of the site, newest first: who, when, from which change, rollbacks and urgent ones flagged. */
export function ReleaseHistory({ site, releases }: Readonly<{ site: string; releases: ReleaseView[] }>) {
  return (
    <div className="overflow-x-auto">
      <table aria-label="Release history" className="text-label">
        <thead>
          <tr>
            <th>Release</th>
            <th>Released</th>
            <th>By</th>
            <th>Change</th>
            <th>Note</th>
            <th>Bundles</th>
          </tr>
        </thead>
        <tbody>
          {releases.map((r, i) => (
            <tr key={r.number} id={`release-${r.number}`} data-testid={`release-${r.number}`} className={r.urgentReason ? "bg-fault-soft" : undefined}>
              <td className="whitespace-nowrap">
                <span className="text-lead font-medium">{r.number}</span>
                {i === 0 ? <span className="ml-2 rounded bg-ok-soft px-1.5 py-0.5 text-micro text-ok">current</span> : null}
                {r.rollbackOf ? <span className="mt-1 block text-micro font-medium text-weir-700">rollback to {r.rollbackOf}</span> : null}
              </td>
              <td className="whitespace-nowrap">{when(r.releasedAt)}</td>
              <td>{r.releasedBy}</td>
              <td>
                {r.changeId ? (
                  <Link href={`/sites/${site}/changes/${r.changeId}`} className="text-weir-700 hover:underline">
                    change {r.changeId}
                  </Link>
                ) : (
                  <span className="text-ink-faint">—</span>
                )}
              </td>
              <td className="max-w-md">
                {r.urgentReason ? (
                  <p className="mb-1 rounded-panel border border-fault px-2 py-1" data-testid="urgent-flag">
                    <strong className="text-fault">Urgent — released without a second reviewer.</strong> Reason: {r.urgentReason}
                  </p>
                ) : null}
                {r.note && r.note !== r.urgentReason ? <span className="whitespace-pre-line">{r.note}</span> : null}
                {!r.note && !r.urgentReason ? <span className="text-ink-faint">—</span> : null}
              </td>
              <td>
                <Bundles site={site} r={r} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
