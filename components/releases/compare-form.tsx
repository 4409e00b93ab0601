import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";

type Props = { site: string; numbers: number[]; from?: number; to?: number };

/** Picks two releases to compare; a plain GET form, so the result has a shareable address. */
export function CompareForm({ site, numbers, from, to }: Readonly<Props>) {
  const [newest, previous] = numbers;
  return (
    <form method="get" action={`/sites/${site}/releases/compare`} aria-label="Compare releases" className="flex flex-wrap items-end gap-3">
      <div className="flex flex-col gap-1">
        <label htmlFor="compare-from" className="text-label font-medium text-ink-soft">
          From release
        </label>
        <select id="compare-from" name="from" defaultValue={from ?? previous ?? newest} className={inputClass}>
          {numbers.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </div>
      <div className="flex flex-col gap-1">
        <label htmlFor="compare-to" className="text-label font-medium text-ink-soft">
          To release
        </label>
        <select id="compare-to" name="to" defaultValue={to ?? newest} className={inputClass}>
          {numbers.map((n) => (
            <option key={n} value={n}>
              {n}
            </option>
          ))}
        </select>
      </div>
      <Button type="submit" tone="quiet">
        Compare
      </Button>
    </form>
  );
}
