import Link from "next/link";
import { CaughtMailDetail } from "@/components/mail/caught-mail-detail";
import { CaughtMailTable } from "@/components/mail/caught-mail-table";
import { MailDeliveryNote } from "@/components/mail/mail-delivery-note";
import { Forbidden } from "@/components/shell/forbidden";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { loadMailAdmin } from "@/lib/mail/caught";
import { can } from "@/lib/permissions";

export const metadata = { title: "Mail" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v);

export default async function MailPage({ searchParams }: Readonly<Props>) {
  const actor = await currentActor();
  if (!actor || !can(actor.role, "fleet.admin")) return <Forbidden what="outgoing mail" />;
  const raw = await searchParams;
  const { delivery, list, selected, missing } = await loadMailAdmin(actor, { page: first(raw.page), message: first(raw.message) });
  const pageHref = (p: number, message?: string) => {
    const q = new URLSearchParams();
    if (p > 1) q.set("page", String(p));
    if (message) q.set("message", message);
    const s = q.toString();
    return s ? `/admin/mail?${s}` : "/admin/mail";
  };
  return (
    <>
      <PageHeader
        title="Mail"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Mail" }]}
        lead="The e-mail Sluice sends when a review is requested, a change is approved or rejected, a release is published or a site is rolled back."
      />
      <div className="flex flex-col gap-4">
        <MailDeliveryNote delivery={delivery} />
        {missing ? (
          <p role="alert" className="rounded-panel bg-caution-soft px-3 py-2 text-label">
            That message is not in the catcher&apos;s store any more.
          </p>
        ) : null}
        {selected ? <CaughtMailDetail message={selected} closeHref={pageHref(list.page)} /> : null}
        {delivery.kind !== "catcher" ? null : list.total === 0 ? (
          <EmptyState title="No messages caught yet">Messages appear here as soon as Sluice sends one, for example when a change is submitted for review.</EmptyState>
        ) : (
          <>
            <p className="text-label text-ink-faint" data-testid="mail-count">
              {list.total} {list.total === 1 ? "message" : "messages"} · page {list.page} of {list.pages}
            </p>
            <CaughtMailTable messages={list.messages} openId={selected?.id ?? null} href={(id) => pageHref(list.page, id)} />
            {list.pages > 1 ? (
              <nav aria-label="Mail pages" className="flex items-center gap-3 text-label">
                {list.page > 1 ? (
                  <Link href={pageHref(list.page - 1)} className="text-weir-600 underline">
                    Newer
                  </Link>
                ) : null}
                {list.page < list.pages ? (
                  <Link href={pageHref(list.page + 1)} className="text-weir-600 underline">
                    Older
                  </Link>
                ) : null}
              </nav>
            ) : null}
          </>
        )}
      </div>
    </>
  );
}
