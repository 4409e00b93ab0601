/** Shown in place of a page the signed-in role may not see (the server refused the data). */
export function Forbidden({ what, level = 1 }: Readonly<{ what: string; level?: 1 | 2 }>) {
  const Heading = level === 1 ? "h1" : "h2";
  return (
    <div role="alert" className="rounded-panel border border-caution bg-caution-soft p-6">
      <Heading className="text-title">Not available to your role</Heading>
      <p className="mt-2 text-ink-soft">Only administrators can see {what}. Ask an administrator if you need access.</p>
    </div>
  );
}
