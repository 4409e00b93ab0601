type Props = {
  conflict: string | null;
  problem: string | null;
  reloadHref: string | null;
  latestHref: string | null;
  problems: { where: string; message: string }[];
};

/** Why the last save failed: a newer revision, a refusal of the whole document, or the fields to fix. */
export function SaveProblems({ conflict, problem, reloadHref, latestHref, problems }: Readonly<Props>) {
  return (
    <>
      {conflict ? (
        <div role="alert" className="rounded-panel border border-caution bg-caution-soft p-4">
          <p className="font-medium">Not saved: someone saved a newer revision while you were editing.</p>
          <p className="mt-1 text-label text-ink-soft">{conflict.charAt(0).toUpperCase() + conflict.slice(1)}.</p>
          <p className="mt-2 flex flex-wrap gap-3 text-label">
            {latestHref ? (
              <a href={latestHref} target="_blank" rel="noreferrer" className="font-medium text-weir-700 underline">
                See the latest revision (new tab)
              </a>
            ) : null}
            {reloadHref ? (
              <a href={reloadHref} className="font-medium text-weir-700 underline">
                Reload the editor with the latest revision
              </a>
            ) : null}
          </p>
          <p className="mt-1 text-micro text-ink-faint">Reloading discards the edits on this page; note them first.</p>
        </div>
      ) : null}
      {problem ? (
        <p role="alert" className="rounded-panel border border-fault bg-fault-soft px-3 py-2 text-label">
          {problem}
        </p>
      ) : null}
      {problems.length > 0 ? (
        <section aria-labelledby="pf-problems-heading" className="rounded-panel border border-fault bg-fault-soft p-3">
          <h2 id="pf-problems-heading" className="text-label font-medium text-fault">
            {problems.length === 1 ? "1 problem" : `${problems.length} problems`} to fix before saving
          </h2>
          <ul className="mt-1 list-disc pl-5 text-label" aria-label="Problems to fix">
            {problems.map((p, i) => (
              <li key={`${p.where}-${i}`}>
                <span className="font-medium">{p.where}:</span> {p.message}
              </li>
            ))}
          </ul>
        </section>
      ) : null}
    </>
  );
}
