import Link from "next/link";
import type { ProfileUsage } from "@/lib/data/profile-usage";
import { EmptyState } from "@/components/ui/empty-state";

/** Where the profile is assigned: site, group and the pinned revision. */
export function ProfileUsageTable({ sites, latest }: Readonly<{ sites: ProfileUsage[]; latest: number }>) {
  if (sites.length === 0) return <EmptyState title="Not used yet">No tag group at any site is assigned this profile.</EmptyState>;
  return (
    <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
      <table aria-label="Groups using this profile">
        <thead>
          <tr>
            <th scope="col">Site</th>
            <th scope="col">Group</th>
            <th scope="col">Pinned revision</th>
          </tr>
        </thead>
        <tbody>
          {sites.map((u) => (
            <tr key={`${u.site}-${u.groupId}`}>
              <td>
                <Link href={`/sites/${u.site}`} className="text-weir-700 hover:underline">
                  {u.siteName || u.site}
                </Link>
              </td>
              <td>
                <Link href={`/sites/${u.site}/groups/${u.groupId}`} className="font-medium text-weir-700 hover:underline">
                  {u.group}
                </Link>
              </td>
              <td className="text-label">
                r{u.revision}
                {u.revision < latest ? <span className="ml-2 text-ink-faint">(latest is r{latest}; the site upgrades through its own change)</span> : <span className="ml-2 text-ink-faint">(latest)</span>}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
