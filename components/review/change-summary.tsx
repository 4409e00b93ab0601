import { CautionNote } from "@/components/assignments/caution-note";

type Statement = { kind: string; text: string; group?: string; regulated?: boolean };

/** The change in words; statements about regulated-record groups stand out (colour and a label). */
export function ChangeSummary({ statements }: Readonly<{ statements: Statement[] }>) {
  if (statements.length === 0) return <p className="text-label text-ink-soft">Nothing to say: the configuration is the same.</p>;
  return (
    <ul aria-label="Change summary" className="flex flex-col gap-1 text-label">
      {statements.map((s, i) => {
        const regulated = s.regulated || s.kind === "regulated";
        return (
          <li
            key={i}
            data-regulated={regulated ? "true" : undefined}
            className={`rounded-panel border px-3 py-1.5 ${regulated ? "border-caution bg-caution-soft" : "border-panel-line bg-panel"}`}
          >
            {regulated ? <span className="mr-2 rounded bg-caution px-1.5 py-0.5 text-micro font-medium text-white">regulated record</span> : null}
            {s.text}
          </li>
        );
      })}
    </ul>
  );
}

/** The regulated-record caution with the groups this change touches. */
export function RegulatedCaution({ groups }: Readonly<{ groups: string[] }>) {
  return (
    <CautionNote>
      <p className="mt-2">
        This change touches {groups.length === 1 ? "the regulated-record group" : "the regulated-record groups"}{" "}
        {groups.map((g, i) => (
          <span key={g}>
            {i > 0 ? ", " : ""}
            <strong className="font-mono">{g}</strong>
          </span>
        ))}
        . The reviewer acknowledges this caution again to approve it.
      </p>
    </CautionNote>
  );
}
