import { METHODS } from "@/lib/reduction/methods";
import type { Profile } from "@/lib/reduction/profile";
import { describeStep } from "./describe-step";
import { MethodHelp } from "./method-help";

/** Each output with its steps in words, in order, and what each method guarantees. */
export function ProfileOutputs({ profile }: Readonly<{ profile: Profile }>) {
  return (
    <div className="flex flex-col gap-3">
      {profile.outputs.map((o) => (
        <section key={o.name} aria-labelledby={`out-${o.name}`} className="rounded-panel border border-panel-line bg-panel p-4">
          <h3 id={`out-${o.name}`} className="text-lead font-medium">
            Output <span className="font-mono">{o.name}</span>
          </h3>
          <p className="text-micro text-ink-faint">The cloud receives this series under each tag&apos;s name with “{o.name}” appended.</p>
          <ol className="mt-3 flex flex-col gap-3" aria-label={`Steps of ${o.name}`}>
            {o.steps.map((s, i) => (
              <li key={i} className="flex gap-3">
                <span aria-hidden className="mt-0.5 w-5 shrink-0 text-right font-mono text-micro text-ink-faint">
                  {i + 1}
                </span>
                <div className="min-w-0 flex-1">
                  <p className="font-medium" data-testid={`step-${o.name}-${i + 1}`}>
                    <span className="sr-only">Step {i + 1}: </span>
                    {describeStep(s)}
                  </p>
                  <details className="mt-0.5">
                    <summary className="cursor-pointer text-micro text-weir-700">About {METHODS[s.method].title}</summary>
                    <div className="mt-1 border-l-2 border-panel-line pl-3">
                      <MethodHelp method={s.method} />
                    </div>
                  </details>
                </div>
              </li>
            ))}
          </ol>
        </section>
      ))}
    </div>
  );
}
