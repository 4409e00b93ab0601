import { REGULATED_RECORD_CAUTION } from "@/lib/cautions";

/** The regulated-record caution from the design, shown wherever lossy steps meet regulated groups. */
export function CautionNote({ children }: Readonly<{ children?: React.ReactNode }>) {
  return (
    <div role="note" aria-label={REGULATED_RECORD_CAUTION.title} className="rounded-panel border border-caution bg-caution-soft p-3 text-label">
      <p className="font-medium">{REGULATED_RECORD_CAUTION.title}</p>
      <p className="mt-1">{REGULATED_RECORD_CAUTION.text}</p>
      {children}
    </div>
  );
}
