import Link from "next/link";
import { redirect } from "next/navigation";
import { navFor } from "@/components/shell/nav-items";
import { SideNav } from "@/components/shell/side-nav";
import { SignOutButton } from "@/components/shell/sign-out-button";
import { SiteSwitcher } from "@/components/shell/site-switcher";
import { currentActor } from "@/lib/auth/guard";
import { fleetAlertCount } from "@/lib/data/fleet";
import { listSites } from "@/lib/data/sites";

export const dynamic = "force-dynamic";

export default async function ConsoleLayout({ children }: Readonly<{ children: React.ReactNode }>) {
  const actor = await currentActor();
  if (!actor) redirect("/sign-in");
  const [sites, alerts] = await Promise.all([listSites(actor), fleetAlertCount(actor)]);
  const badges = alerts > 0 ? { "/fleet": { count: alerts, label: `${alerts} ${alerts === 1 ? "gateway" : "gateways"} stale or failing` } } : undefined;
  return (
    <div className="min-h-screen md:grid md:grid-cols-[13rem_1fr]">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:m-2 focus:bg-panel focus:p-2">
        Skip to content
      </a>
      <aside className="bg-panel-deep px-3 py-3 md:min-h-screen md:py-5">
        <Link href="/" className="mb-2 block px-3 text-title font-bold text-white md:mb-6">
          Sluice
        </Link>
        <SideNav items={navFor(actor.role)} badges={badges} />
      </aside>
      <div className="flex min-w-0 flex-col">
        <div className="flex flex-wrap items-center justify-between gap-3 border-b border-panel-line bg-panel px-4 py-2">
          <SiteSwitcher sites={sites.map((s) => ({ slug: s.slug, name: s.name }))} />
          <div className="flex items-center gap-3">
            <span className="text-label text-ink-soft" data-testid="signed-in-as">
              {actor.name} · <span className="font-medium capitalize">{actor.role}</span>
            </span>
            <SignOutButton />
          </div>
        </div>
        <main id="main" className="mx-auto w-full max-w-6xl flex-1 px-4 py-6 md:px-8">
          {children}
        </main>
      </div>
    </div>
  );
}
