import Link from "next/link";
import { ProfileFilters, type LibraryQuery } from "@/components/profiles/profile-filters";
import { ProfileTable } from "@/components/profiles/profile-table";
import { PageHeader } from "@/components/shell/page-header";
import { EmptyState } from "@/components/ui/empty-state";
import { currentActor } from "@/lib/auth/guard";
import { listProfiles } from "@/lib/data/profiles";
import { can } from "@/lib/permissions";
import { TAG_KINDS } from "@/lib/reduction/profile-names";

export const metadata = { title: "Profiles" };

type Props = { searchParams: Promise<Record<string, string | string[] | undefined>> };

const first = (v: string | string[] | undefined) => (Array.isArray(v) ? v[0] : v) ?? "";

function readQuery(raw: Record<string, string | string[] | undefined>): LibraryQuery {
  const status = first(raw.status);
  const kind = first(raw.kind);
  return {
    q: first(raw.q).trim().slice(0, 80),
    status: status === "archived" || status === "all" ? status : "active",
    kind: (TAG_KINDS as readonly string[]).includes(kind) ? kind : "",
  };
}

export default async function ProfilesPage({ searchParams }: Readonly<Props>) {
  const query = readQuery(await searchParams);
  const actor = await currentActor();
  const profiles = await listProfiles(actor, { q: query.q, status: query.status, ...(query.kind ? { kind: query.kind } : {}) });
  const canEdit = !!actor && can(actor.role, "config.edit");
  const filtered = query.q !== "" || query.status !== "active" || query.kind !== "";
  return (
    <>
      <PageHeader
        title="Reduction profiles"
        crumbs={[{ href: "/", label: "Overview" }, { label: "Profiles" }]}
        lead="Reusable, site-independent recipes: each output is a chain of steps that makes one series the cloud receives per tag. Groups pin a revision of a profile."
        actions={
          canEdit ? (
            <>
              <Link href="/profiles/import" className="rounded-panel border border-panel-line bg-panel px-3 py-1.5 text-label font-medium hover:bg-panel-sunk">
                Import YAML
              </Link>
              <Link href="/profiles/new" className="rounded-panel bg-weir-600 px-3 py-1.5 text-label font-medium text-white hover:bg-weir-700">
                New profile
              </Link>
            </>
          ) : null
        }
      />
      <ProfileFilters query={query} />
      {profiles.length === 0 ? (
        filtered ? (
          <EmptyState title="No profiles match">Widen the search or choose another status or kind.</EmptyState>
        ) : (
          <EmptyState title="No profiles yet">
            {canEdit ? "Use New profile to write the first recipe, or Import YAML to bring one in." : "Engineers write the reusable profiles here."}
          </EmptyState>
        )
      ) : (
        <>
          <p className="mb-2 text-label text-ink-faint" data-testid="profile-count">
            {profiles.length} {profiles.length === 1 ? "profile" : "profiles"}
          </p>
          <ProfileTable profiles={profiles} />
        </>
      )}
    </>
  );
}
