import type { MailDelivery } from "@/lib/mail/caught";

/** Where Sluice's e-mail goes, said once above the list. */
export function MailDeliveryNote({ delivery }: Readonly<{ delivery: MailDelivery }>) {
  if (delivery.kind === "server") {
    return (
      <p className="rounded-panel border border-panel-line bg-panel px-3 py-2 text-label" data-testid="mail-delivery">
        Messages go to the mail server at <span className="font-mono">{delivery.server}</span> (<code>SMTP_URL</code>). Sluice keeps no copy, so
        none are listed here; that server&apos;s logs show what was delivered.
      </p>
    );
  }
  if (delivery.kind === "none") {
    return (
      <p role="alert" className="rounded-panel bg-caution-soft px-3 py-2 text-label" data-testid="mail-delivery">
        No mail server is configured, so Sluice sends no e-mail. Set <code>SMTP_URL</code> to a mail server, or start Sluice with{" "}
        <code>npm start</code> to catch messages locally.
      </p>
    );
  }
  return (
    <p className="rounded-panel border border-panel-line bg-panel px-3 py-2 text-label" data-testid="mail-delivery">
      Outgoing mail is caught by the local mail catcher{delivery.server ? <> on <span className="font-mono">{delivery.server}</span></> : null}{" "}
      and kept in <span className="font-mono">{delivery.dir}</span>. Nothing is delivered to anyone: set <code>SMTP_URL</code> to a real mail
      server to send e-mail.
    </p>
  );
}
