import { EstimateTable } from "@/components/estimates/estimate-table";
import { fmt, fmtBytes, fmtDuration } from "@/components/estimates/format";
import { currentActor } from "@/lib/auth/guard";
import { siteEstimate, type ConfigEstimate } from "@/lib/data/estimates";

type Props = { params: Promise<{ site: string }> };

function Uplink({ e, budget, title }: Readonly<{ e: ConfigEstimate; budget: number; title: string }>) {
  const state = e.overBudgetMean ? "over budget at the mean" : e.overBudgetPeak ? "over budget at the peak" : "within budget";
  return (
    <div className={`rounded-panel border p-3 text-label ${e.overBudgetMean || e.overBudgetPeak ? "border-fault bg-fault-soft" : "border-panel-line bg-panel"}`} data-testid={`uplink-${title}`}>
      <p className="font-medium">
        {title}: {fmt(e.totals.meanKbps)} kbit/s mean, {fmt(e.totals.peakKbps)} kbit/s peak — {state}
      </p>
      <p className="text-ink-soft">
        Budget {fmt(budget)} kbit/s, usable {fmt(e.usableKbps)} kbit/s. Cloud storage {fmt(e.totals.gbPerMonthPlain)} GB per month; {fmt(e.storageGbAtRetention)} GB held at retention,
        about {fmt(e.storageCostPerMonthAtRetention)} per month.
      </p>
      <p className="text-ink-soft">Catch-up after an outage: {e.catchUp.map((c) => `${c.outageS / 3600} h → ${fmtDuration(c.seconds)}`).join("; ")}.</p>
    </div>
  );
}

export default async function EstimatesPage({ params }: Readonly<Props>) {
  const { site } = await params;
  const actor = await currentActor();
  const e = await siteEstimate(actor, site);
  const budget = e.site.uplinkBudgetKbps;
  return (
    <section aria-labelledby="estimates-heading" className="flex flex-col gap-4">
      <div>
        <h2 id="estimates-heading">Savings estimate</h2>
        <p className="text-label text-ink-soft">
          Estimates from the groups&apos; profiles and sample sets, not measurements. Byte model: {e.byteModel.bytesPerSample} bytes per sample plus {e.byteModel.transportOverheadPct} %
          transport overhead ({fmtBytes(e.byteModel.bytesPerSample * (1 + e.byteModel.transportOverheadPct / 100))} per sample on the wire).
        </p>
      </div>
      <div className="grid gap-3 md:grid-cols-2">
        {e.released ? <Uplink e={e.released} budget={budget} title="Current release" /> : null}
        <Uplink e={e.working} budget={budget} title={e.hasDraft ? "With the draft change" : "Current configuration"} />
      </div>
      <details className="rounded-panel border border-panel-line bg-panel p-3 text-label">
        <summary className="cursor-pointer font-medium">Assumptions behind these figures</summary>
        <ul className="mt-2 list-disc pl-5" aria-label="Assumptions">
          {e.assumptions.map((a) => (
            <li key={a}>{a}</li>
          ))}
        </ul>
      </details>
      <EstimateTable estimate={e.working} label={e.hasDraft ? "Estimate with the draft change" : "Estimate of the current configuration"} />
      {e.released && e.hasDraft ? (
        <details className="text-label">
          <summary className="cursor-pointer font-medium">Current release, group by group</summary>
          <EstimateTable estimate={e.released} label="Estimate of the current release" />
        </details>
      ) : null}
    </section>
  );
}
