import Link from "next/link";
import type { RevisionInfo } from "@/lib/data/profiles";
import { CompareForm } from "./compare-form";
import { formatWhen } from "./describe-step";

type Props = { profileId: number; revisions: RevisionInfo[] };

/** Every revision, newest first: who saved it, when, why; its YAML; and a way to compare any two. */
export function RevisionHistory({ profileId, revisions }: Readonly<Props>) {
  const numbers = revisions.map((r) => r.number);
  const latest = numbers[0] ?? 1;
  return (
    <div className="flex flex-col gap-3">
      {revisions.length > 1 ? <CompareForm profileId={profileId} revisions={numbers} from={numbers[1]} to={latest} /> : <p className="text-label text-ink-faint">Only one revision so far.</p>}
      <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
        <table aria-label="Revisions">
          <thead>
            <tr>
              <th scope="col">Revision</th>
              <th scope="col">Saved by</th>
              <th scope="col">When</th>
              <th scope="col">Note</th>
              <th scope="col">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody>
            {revisions.map((r) => (
              <tr key={r.number}>
                <td className="font-medium">
                  r{r.number}
                  {r.number === latest ? <span className="ml-2 text-micro font-normal text-ink-faint">latest</span> : null}
                </td>
                <td className="text-label">{r.createdBy}</td>
                <td className="text-label">
                  <time dateTime={r.createdAt}>{formatWhen(r.createdAt)}</time>
                </td>
                <td className="text-label">{r.note || <span className="text-ink-faint">no note</span>}</td>
                <td className="whitespace-nowrap text-label">
                  {r.number > 1 ? (
                    <Link href={`/profiles/${profileId}/compare?from=${r.number - 1}&to=${r.number}`} aria-label={`What changed in revision ${r.number}`} className="mr-3 text-weir-700 underline">
                      What changed
                    </Link>
                  ) : null}
                  <a href={`/api/profiles/${profileId}/export?revision=${r.number}`} download aria-label={`Export revision ${r.number} as YAML`} className="text-weir-700 underline">
                    YAML
                  </a>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
