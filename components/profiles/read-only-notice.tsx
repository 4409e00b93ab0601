/** Shown instead of an editor to roles that read profiles but do not write them. */
export function ReadOnlyNotice() {
  return (
    <div role="alert" className="rounded-panel border border-caution bg-caution-soft p-6">
      <p className="text-title">Read only for your role</p>
      <p className="mt-2 text-ink-soft">Engineers and administrators write profiles. You can read every profile and its history in the library.</p>
    </div>
  );
}
