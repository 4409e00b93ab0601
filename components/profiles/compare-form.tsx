import { inputClass } from "@/components/ui/field";

type Props = { profileId: number; revisions: number[]; from: number; to: number };

/** Pick any two revisions to compare (a GET form to the compare page). */
export function CompareForm({ profileId, revisions, from, to }: Readonly<Props>) {
  const options = revisions.map((n) => (
    <option key={n} value={n}>
      revision {n}
    </option>
  ));
  return (
    <form method="get" action={`/profiles/${profileId}/compare`} aria-label="Compare revisions" className="flex flex-wrap items-end gap-3">
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        From revision
        <select name="from" defaultValue={from} className={inputClass}>
          {options}
        </select>
      </label>
      <label className="flex flex-col gap-1 text-label text-ink-soft">
        To revision
        <select name="to" defaultValue={to} className={inputClass}>
          {options}
        </select>
      </label>
      <button type="submit" className="min-h-9 rounded-panel bg-weir-600 px-3 text-label font-medium text-white hover:bg-weir-700">
        Compare
      </button>
    </form>
  );
}
