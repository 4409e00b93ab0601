import { METHODS } from "@/lib/reduction/methods";
import type { StepMethod } from "@/lib/reduction/profile";

type Props = { method: StepMethod; id?: string; withTitle?: boolean };

/** What a method guarantees, where it is published, and whether it loses information. */
export function MethodHelp({ method, id, withTitle = false }: Readonly<Props>) {
  const info = METHODS[method];
  return (
    <div id={id} className="flex flex-col gap-0.5 text-micro text-ink-soft">
      {withTitle ? <p className="font-medium text-ink">{info.title}</p> : null}
      <p>{info.guarantee}</p>
      <p>
        <span className={info.lossy ? "font-medium text-caution" : "font-medium text-ok"}>{info.lossy ? "Lossy" : "Lossless"}</span>
        {" · "}
        {info.role === "selection" ? "keeps samples of its input" : "one new value per window"}
        {info.streaming ? "" : " · needs the whole series (no gateway stream)"}
      </p>
      <p>
        <span className="text-ink-faint">Source:</span> {info.source}
      </p>
    </div>
  );
}
