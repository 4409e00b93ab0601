import Link from "next/link";
import type { CaughtMail } from "@/lib/mail/caught";

/** One caught message: its headers and its plain text. */
export function CaughtMailDetail({ message, closeHref }: Readonly<{ message: CaughtMail; closeHref: string }>) {
  const rows: [string, string][] = [
    ["Subject", message.subject || "(no subject)"],
    ["From", message.from],
    ["To", message.headerTo || message.to.join(", ")],
    ...(message.cc ? ([["Cc", message.cc]] as [string, string][]) : []),
    ["Envelope recipients", message.to.join(", ")],
    ["Received", message.receivedAt],
  ];
  return (
    <section aria-labelledby="mail-detail-title" className="rounded-panel border border-panel-line bg-panel p-4" data-testid="mail-detail">
      <div className="mb-3 flex items-start justify-between gap-3">
        <h2 id="mail-detail-title" className="text-lead font-medium">
          {message.subject || "(no subject)"}
        </h2>
        <Link href={closeHref} className="text-label text-weir-600 underline">
          Close
        </Link>
      </div>
      <dl className="mb-3 grid grid-cols-[max-content_1fr] gap-x-4 gap-y-1 text-label">
        {rows.map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-ink-faint">{k}</dt>
            <dd className="break-all">{v}</dd>
          </div>
        ))}
      </dl>
      <pre className="overflow-x-auto whitespace-pre-wrap rounded-panel bg-panel-sunk p-3 font-mono text-micro leading-5" aria-label="Message text">
        {message.text || "(this message has no text part)"}
      </pre>
    </section>
  );
}
