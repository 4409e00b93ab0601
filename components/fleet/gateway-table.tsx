import Link from "next/link";
import type { FleetGateway } from "@/lib/data/fleet";
import { ratioText, relativeTime, shortDigest, utcTime } from "./format";
import { StateBadge } from "./state-badge";

type Props = { gateways: FleetGateway[]; now: Date; showSite: boolean };

function When({ at, now }: Readonly<{ at: Date; now: Date }>) {
  return (
    <time dateTime={at.toISOString()} title={utcTime(at)} className="whitespace-nowrap">
      {relativeTime(at, now)}
    </time>
  );
}

function Release({ n, site }: Readonly<{ n: number | null; site: string }>) {
  if (n === null) return <span className="text-ink-faint">none</span>;
  return (
    <Link href={`/sites/${encodeURIComponent(site)}/releases`} className="font-medium tabular-nums text-weir-700 hover:underline">
      release {n}
    </Link>
  );
}

function UnknownTags({ tags }: Readonly<{ tags: string[] }>) {
  if (tags.length === 0) return <span className="text-ink-faint">none</span>;
  return (
    <details>
      <summary className="cursor-pointer whitespace-nowrap text-caution">
        {tags.length} not in inventory
      </summary>
      {/* Focusable so the list can be scrolled from the keyboard. */}
      <ul className="mt-1 max-h-40 overflow-y-auto font-mono text-micro" aria-label="Tags the gateway sees that the inventory lacks" tabIndex={0}>
        {tags.map((t) => (
          <li key={t}>{t}</li>
        ))}
      </ul>
    </details>
  );
}

/** The gateways with target beside running release, last check-in, state, failure, ratios and unknown tags. */
export function GatewayTable({ gateways, now, showSite }: Readonly<Props>) {
  return (
    <div className="overflow-x-auto">
      <table className="w-full text-label" aria-label="Gateways">
        <thead className="text-left text-ink-soft">
          <tr className="border-b border-panel-line">
            <th scope="col" className="py-2 pr-3 font-medium">Gateway</th>
            <th scope="col" className="py-2 pr-3 font-medium">State</th>
            <th scope="col" className="py-2 pr-3 font-medium">Target</th>
            <th scope="col" className="py-2 pr-3 font-medium">Running</th>
            <th scope="col" className="py-2 pr-3 font-medium">Last check-in</th>
            <th scope="col" className="py-2 pr-3 text-right font-medium">
              Ratio measured · estimated
            </th>
            <th scope="col" className="py-2 font-medium">Unknown tags</th>
          </tr>
        </thead>
        <tbody>
          {gateways.map((g) => (
            <tr key={`${g.site}/${g.slug}`} className="border-b border-panel-line align-top" data-testid={`gateway-${g.site}-${g.slug}`}>
              <th scope="row" className="py-2 pr-3 text-left text-body font-normal normal-case text-ink">
                <Link href={`/sites/${encodeURIComponent(g.site)}/gateways/${encodeURIComponent(g.slug)}`} className="font-medium text-weir-700 hover:underline">
                  {g.name}
                </Link>
                <div className="font-mono text-micro text-ink-faint">{g.slug}</div>
                {showSite ? <div className="text-micro text-ink-soft">{g.siteName}</div> : null}
              </th>
              <td className="py-2 pr-3">
                <StateBadge state={g.state} />
                {g.failureMessage !== null ? (
                  <p className="mt-1 max-w-xs break-words text-fault" data-testid="failure-message">
                    {g.failureMessage || "no message given"}
                    {g.failingSince ? (
                      <span className="block text-micro text-ink-soft">
                        failing since <When at={g.failingSince} now={now} />
                      </span>
                    ) : null}
                  </p>
                ) : null}
                {g.flags.lowerReleaseReported !== null ? (
                  <p className="mt-1 text-micro text-caution">reported lower release {g.flags.lowerReleaseReported}</p>
                ) : null}
                {g.flags.digestMismatch ? <p className="mt-1 text-micro text-fault">runs other bytes than the target bundle</p> : null}
              </td>
              <td className="py-2 pr-3">
                <Release n={g.targetRelease} site={g.site} />
              </td>
              <td className="py-2 pr-3" data-testid="running-release">
                <Release n={g.runningRelease} site={g.site} />
                {g.runningDigest ? (
                  <div className="font-mono text-micro text-ink-faint" title={g.runningDigest}>
                    {shortDigest(g.runningDigest)}
                  </div>
                ) : null}
                {g.appliedAt ? (
                  <div className="text-micro text-ink-soft">
                    applied <When at={g.appliedAt} now={now} />
                  </div>
                ) : null}
              </td>
              <td className="py-2 pr-3">
                {g.lastCheckInAt ? <When at={g.lastCheckInAt} now={now} /> : <span className="text-ink-faint">never</span>}
                <div className="whitespace-nowrap text-micro text-ink-faint">polls every {g.pollSeconds} s</div>
              </td>
              <td className="py-2 pr-3 text-right tabular-nums">
                <span title={g.measured ? `${g.measured.pointsIn.toLocaleString("en")} points in, ${g.measured.pointsOut.toLocaleString("en")} out, ${g.measured.reports} reports in the last 24 h` : "no reports for the running release in the last 24 h"}>
                  {g.measured ? ratioText(g.measured.ratio, g.measured.pointsIn > 0) : "—"}
                </span>
                {" · "}
                <span title={g.estimated ? `estimate for release ${g.estimated.release}` : "no release to estimate"}>
                  {g.estimated ? ratioText(g.estimated.ratio, g.estimated.samplesPerDayIn > 0) : "—"}
                </span>
              </td>
              <td className="py-2">
                <UnknownTags tags={g.unknownTags} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
