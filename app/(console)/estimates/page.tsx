import Link from "next/link";
import { fmt } from "@/components/estimates/format";
import { PageHeader } from "@/components/shell/page-header";
import { currentActor } from "@/lib/auth/guard";
import { fleetEstimate } from "@/lib/data/estimates";

export default async function FleetEstimatesPage() {
  const actor = await currentActor();
  const rows = await fleetEstimate(actor);
  return (
    <>
      <PageHeader title="Uplink and storage" crumbs={[{ href: "/", label: "Overview" }, { label: "Uplink and storage" }]} />
      <p className="mb-3 text-label text-ink-soft">Estimated uplink per site, current release beside the draft change. Open a site for the assumptions and the figures per group.</p>
      <table className="w-full text-label" aria-label="Uplink per site">
        <thead className="text-left text-ink-soft">
          <tr className="border-b border-panel-line">
            <th className="py-2 pr-3 font-medium">Site</th>
            <th className="py-2 pr-3 text-right font-medium">Budget (usable) kbit/s</th>
            <th className="py-2 pr-3 text-right font-medium">Release: mean · peak</th>
            <th className="py-2 pr-3 text-right font-medium">Draft: mean · peak</th>
            <th className="py-2 font-medium">State</th>
          </tr>
        </thead>
        <tbody>
          {rows.map((r) => (
            <tr key={r.slug} className="border-b border-panel-line" data-testid={`fleet-${r.slug}`}>
              <td className="py-2 pr-3">
                <Link href={`/sites/${r.slug}/estimates`} className="font-medium text-weir-700 hover:underline">
                  {r.name}
                </Link>
              </td>
              <td className="py-2 pr-3 text-right tabular-nums">
                {fmt(r.budgetKbps)} ({fmt(r.usableKbps)})
              </td>
              <td className="py-2 pr-3 text-right tabular-nums">{r.released ? `${fmt(r.released.meanKbps)} · ${fmt(r.released.peakKbps)}` : "no release"}</td>
              <td className="py-2 pr-3 text-right tabular-nums">{r.hasDraft ? `${fmt(r.working.meanKbps)} · ${fmt(r.working.peakKbps)}` : "no draft"}</td>
              <td className="py-2">
                {r.overBudgetMean ? (
                  <span className="rounded bg-fault-soft px-1.5 py-0.5 text-fault">over budget</span>
                ) : r.overBudgetPeak ? (
                  <span className="rounded bg-caution-soft px-1.5 py-0.5 text-caution">over budget at peak</span>
                ) : (
                  <span className="rounded bg-ok-soft px-1.5 py-0.5 text-ok">within budget</span>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </>
  );
}
