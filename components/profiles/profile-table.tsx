import Link from "next/link";
import type { ProfileSummary } from "@/lib/data/profiles";
import { METHODS } from "@/lib/reduction/methods";
import type { StepMethod } from "@/lib/reduction/profile";
import { ArchivedBadge, KindList, LossyBadge } from "./badges";
import { plural } from "./describe-step";

const titleOf = (m: string) => (m in METHODS ? METHODS[m as StepMethod].title : m);

/** The library: one row per profile with what it makes, how, and where it is used. */
export function ProfileTable({ profiles }: Readonly<{ profiles: ProfileSummary[] }>) {
  return (
    <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
      <table aria-label="Reduction profiles">
        <thead>
          <tr>
            <th scope="col">Profile</th>
            <th scope="col">Kinds</th>
            <th scope="col">Outputs</th>
            <th scope="col">Methods</th>
            <th scope="col">Latest revision</th>
            <th scope="col">Used by</th>
            <th scope="col">Reduction</th>
          </tr>
        </thead>
        <tbody>
          {profiles.map((p) => (
            <tr key={p.id} data-testid={`profile-row-${p.id}`}>
              <td>
                <Link href={`/profiles/${p.id}`} className="font-medium text-weir-700 hover:underline">
                  {p.name}
                </Link>
                {p.archived ? (
                  <span className="ml-2">
                    <ArchivedBadge />
                  </span>
                ) : null}
                {p.description ? <p className="max-w-xs truncate text-micro text-ink-faint">{p.description}</p> : null}
              </td>
              <td>
                <KindList kinds={p.kinds} />
              </td>
              <td className="font-mono text-label">{p.outputs.join(", ")}</td>
              <td className="text-label">{p.methods.map(titleOf).join(", ")}</td>
              <td className="text-label">r{p.latestRevision}</td>
              <td className="text-label">{p.usage === 0 ? <span className="text-ink-faint">not used</span> : `used by ${plural(p.usage, "group")}`}</td>
              <td>
                <LossyBadge lossy={p.lossy} />
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
