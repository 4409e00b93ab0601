/** Shown in place of a page the signed-in role may not see (the server refused the data). */
export function Forbidden({ what }: Readonly<{ what: string }>) {
  return (
    <div role="alert" className="rounded-panel border border-caution bg-caution-soft p-6">
      <h1 className="text-title">Not available to your role</h1>
      <p className="mt-2 text-ink-soft">Only administrators can see {what}. Ask an administrator if you need access.</p>
    </div>
  );
}
