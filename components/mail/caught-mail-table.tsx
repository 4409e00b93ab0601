import Link from "next/link";
import type { CaughtMailSummary } from "@/lib/mail/caught";

type Props = { messages: CaughtMailSummary[]; openId: string | null; href: (id: string) => string };

const when = (iso: string) => iso.replace("T", " ").replace(/\.\d+Z$/, "Z");

/** Caught messages, newest first; the subject opens the message. */
export function CaughtMailTable({ messages, openId, href }: Readonly<Props>) {
  return (
    <div className="overflow-x-auto rounded-panel border border-panel-line bg-panel">
      <table aria-label="Caught messages">
        <thead>
          <tr>
            <th scope="col">Received (UTC)</th>
            <th scope="col">From</th>
            <th scope="col">To</th>
            <th scope="col">Subject</th>
          </tr>
        </thead>
        <tbody>
          {messages.map((m) => (
            <tr key={m.id} data-testid={`mail-${m.id}`} aria-current={m.id === openId ? "true" : undefined} className={m.id === openId ? "bg-panel-sunk" : undefined}>
              <td className="whitespace-nowrap font-mono text-micro">
                <time dateTime={m.receivedAt}>{when(m.receivedAt)}</time>
              </td>
              <td>{m.from}</td>
              <td>{m.to.join(", ")}</td>
              <td>
                <Link href={href(m.id)} className="text-weir-600 underline-offset-2 hover:underline">
                  {m.subject || "(no subject)"}
                </Link>
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
