import Link from "next/link";
import { DeleteGatewayButton } from "@/components/sites/delete-controls";
import { GatewayForm } from "@/components/sites/gateway-form";
import { GatewayTokens } from "@/components/sites/gateway-tokens";
import { currentActor } from "@/lib/auth/guard";
import { listGatewayTokens } from "@/lib/data/gateway-tokens";
import { getGateway, getSite } from "@/lib/data/sites";
import { can } from "@/lib/permissions";
import { orNotFound } from "@/lib/site-page";

type Props = { params: Promise<{ site: string; gateway: string }> };

export default async function GatewayPage({ params }: Readonly<Props>) {
  const { site: siteSlug, gateway: gatewaySlug } = await params;
  const actor = await currentActor();
  const site = await orNotFound(getSite(actor, siteSlug));
  const gw = await orNotFound(getGateway(actor, siteSlug, gatewaySlug));
  const admin = !!actor && can(actor.role, "fleet.admin");
  const tokens = admin ? await listGatewayTokens(actor, siteSlug, gatewaySlug) : [];
  return (
    <>
      <nav aria-label="Breadcrumb" className="mb-1 text-micro text-ink-faint">
        <Link href={`/sites/${site.slug}`} className="hover:underline">
          Gateways
        </Link>{" "}
        › {gw.name}
      </nav>
      <h2 className="mb-4">{gw.name}</h2>
      <dl className="mb-8 grid max-w-3xl grid-cols-2 gap-x-4 gap-y-2 rounded-panel border border-panel-line bg-panel p-4 text-label">
        <dt className="text-ink-faint">Slug</dt>
        <dd className="font-mono">{gw.slug}</dd>
        <dt className="text-ink-faint">Pulls its bundle every</dt>
        <dd>{gw.pollSeconds} s</dd>
        <dt className="text-ink-faint">Description</dt>
        <dd>{gw.description || "—"}</dd>
      </dl>
      {admin ? (
        <>
          <section aria-labelledby="edit-gateway" className="mb-8 rounded-panel border border-panel-line bg-panel p-4">
            <h2 id="edit-gateway" className="mb-3">
              Edit gateway
            </h2>
            <GatewayForm site={site.slug} existing={{ name: gw.name, slug: gw.slug, description: gw.description, pollSeconds: gw.pollSeconds }} />
          </section>
          <GatewayTokens site={site.slug} gateway={gw.slug} gatewayName={gw.name} tokens={tokens} />
          <section aria-labelledby="danger" className="rounded-panel border border-fault/40 bg-panel p-4">
            <h2 id="danger" className="text-lead font-medium text-fault">
              Delete this gateway
            </h2>
            <div className="mt-2">
              <DeleteGatewayButton site={site.slug} gateway={gw.slug} name={gw.name} />
            </div>
          </section>
        </>
      ) : null}
    </>
  );
}
