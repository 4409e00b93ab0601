import Link from "next/link";
import type { ReactNode } from "react";
import { inputClass } from "./field";

type FormProps = {
  /** The page the form reloads with its fields in the URL, which keeps the view. */
  action: string;
  label: string;
  /** Grid columns of the panel, e.g. "sm:grid-cols-[1fr_1fr_auto]". */
  columns: string;
  /** Whether any filter is set; then a link clears them all. */
  filtered: boolean;
  children: ReactNode;
};

/** A page's filters as a plain GET form in a panel, with Filter and (when filtering) Clear. */
export function FilterForm({ action, label, columns, filtered, children }: Readonly<FormProps>) {
  return (
    <form method="get" action={action} role="search" aria-label={label} className={`mb-4 grid gap-3 rounded-panel border border-panel-line bg-panel p-4 sm:items-end ${columns}`}>
      {children}
      <div className="flex gap-2">
        <button type="submit" className="min-h-9 rounded-panel bg-weir-600 px-3 text-label font-medium text-white hover:bg-weir-700">
          Filter
        </button>
        {filtered ? (
          <Link href={action} className="min-h-9 rounded-panel border border-panel-line px-3 py-2 text-label">
            Clear
          </Link>
        ) : null}
      </div>
    </form>
  );
}

type SelectProps = {
  label: string;
  name: string;
  value: string | undefined;
  /** The first option, which filters nothing ("any state"); omit when every option filters. */
  anyLabel?: string;
  options: readonly (string | { value: string; label: string })[];
};

/** A labelled select of a filter form. */
export function FilterSelect({ label, name, value, anyLabel, options }: Readonly<SelectProps>) {
  return (
    <label className="flex flex-col gap-1 text-label text-ink-soft">
      {label}
      <select name={name} defaultValue={value ?? ""} className={inputClass}>
        {anyLabel === undefined ? null : <option value="">{anyLabel}</option>}
        {options.map((o) => {
          const { value: v, label: text } = typeof o === "string" ? { value: o, label: o } : o;
          return (
            <option key={v} value={v}>
              {text}
            </option>
          );
        })}
      </select>
    </label>
  );
}

/** A labelled input of a filter form. */
export function FilterInput({ label, name, value, type = "text", placeholder }: Readonly<{ label: string; name: string; value: string | undefined; type?: string; placeholder?: string }>) {
  return (
    <label className="flex flex-col gap-1 text-label text-ink-soft">
      {label}
      <input type={type} name={name} defaultValue={value ?? ""} placeholder={placeholder} className={inputClass} />
    </label>
  );
}
