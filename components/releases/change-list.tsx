import Link from "next/link";
import { StateBadge, when } from "@/components/review/change-status";

type Row = { id: number; state: string; note: string; rollbackOf: number | null; submittedAt: string | null; updatedAt: string };

/** The site's changes that reached review, newest first, each linking to its review page. */
export function ChangeList({ site, changes }: Readonly<{ site: string; changes: Row[] }>) {
  const shown = changes.filter((c) => c.submittedAt).slice(0, 10);
  if (shown.length === 0) return <p className="text-label text-ink-soft">No change has been submitted for review yet.</p>;
  return (
    <ul aria-label="Changes" className="flex flex-col text-label">
      {shown.map((c) => (
        <li key={c.id} className="flex flex-wrap items-center gap-3 border-b border-panel-line py-1.5 last:border-0">
          <Link href={`/sites/${site}/changes/${c.id}`} className="font-medium text-weir-700 hover:underline">
            Change {c.id}
          </Link>
          <StateBadge state={c.state} />
          {c.rollbackOf ? <span className="text-micro text-weir-700">rollback to {c.rollbackOf}</span> : null}
          <span className="text-ink-faint">submitted {when(c.submittedAt!)}</span>
          <span className="min-w-0 flex-1 truncate text-ink-soft">{c.note}</span>
        </li>
      ))}
    </ul>
  );
}
