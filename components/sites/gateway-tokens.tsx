"use client";

import { zodResolver } from "@hookform/resolvers/zod";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useForm } from "react-hook-form";
import { toast } from "sonner";
import { issueGatewayTokenAction, revokeGatewayTokenAction } from "@/app/(console)/sites/[site]/gateways/[gateway]/actions";
import { when } from "@/components/review/change-status";
import { Button } from "@/components/ui/button";
import { ConfirmButton } from "@/components/ui/confirm-button";
import { Field, inputClass } from "@/components/ui/field";
import { showFailure } from "@/components/ui/form-error";
import { SecretReveal } from "@/components/ui/secret-reveal";
import type { GatewayTokenView, IssuedToken } from "@/lib/data/gateway-tokens";
import { TOKEN_DAYS_CHOICES, issueTokenSchema, type IssueTokenInput, type IssueTokenValues } from "@/schemas/gateway-token";

type Props = { site: string; gateway: string; gatewayName: string; tokens: GatewayTokenView[] };

/** A gateway's bearer tokens for admins: issue (shown once), list by prefix, revoke. */
export function GatewayTokens({ site, gateway, gatewayName, tokens }: Readonly<Props>) {
  const router = useRouter();
  const [issued, setIssued] = useState<IssuedToken | null>(null);
  const { register, handleSubmit, setError, reset, formState } = useForm<IssueTokenInput, unknown, IssueTokenValues>({
    resolver: zodResolver(issueTokenSchema),
    defaultValues: { label: "", expiresInDays: null },
  });
  const onSubmit = handleSubmit(async (values) => {
    const result = await issueGatewayTokenAction({ site, gateway, values });
    if (!result.ok) return showFailure(result, setError, ["label", "expiresInDays"]);
    setIssued(result.data);
    reset();
    toast.success(`Token ${result.data.prefix}… issued for ${gatewayName}.`);
    router.refresh();
  });
  const count = { live: 0, expired: 0, revoked: 0 };
  for (const t of tokens) count[t.state]++;

  return (
    <section aria-labelledby="gateway-tokens" className="mb-8 rounded-panel border border-panel-line bg-panel p-4">
      <h2 id="gateway-tokens" className="mb-1">
        Tokens
      </h2>
      <p className="mb-3 max-w-3xl text-label text-ink-soft">
        The gateway sends one of these as its bearer token when it pulls its bundle and checks in. Sluice keeps only a hash and the first characters
        (the prefix), so a token can be told apart here but never shown again.
      </p>
      <p className="mb-4 max-w-3xl rounded-panel bg-panel-sunk px-3 py-2 text-label text-ink-soft">
        <span className="font-medium text-ink">To rotate:</span> issue a new token, deploy it to the gateway, and once the new one shows a recent{" "}
        <em>last used</em> time, revoke the old one. Until it is revoked the old token keeps working, so the gateway never goes without one.
      </p>

      {issued ? (
        <SecretReveal
          className="mb-4"
          testId="issued-token"
          label={`New token ${issued.prefix}…${issued.label ? ` (${issued.label})` : ""}`}
          secret={issued.token}
          onDone={() => setIssued(null)}
          note={
            <>
              <strong className="font-medium text-caution">Shown only now.</strong> Copy it into the gateway&apos;s configuration; Sluice keeps only a hash and
              cannot show it again. If it is lost, issue another and revoke this one.
            </>
          }
        />
      ) : null}

      <form onSubmit={onSubmit} noValidate className="mb-4 grid gap-3 sm:grid-cols-[minmax(0,24rem)_minmax(0,12rem)_auto] sm:items-start sm:justify-start">
        <Field label="Token label" htmlFor="token-label" error={formState.errors.label?.message} hint="Optional: where it is deployed or why, e.g. “edge box, 2027 rotation”.">
          <input id="token-label" className={inputClass} aria-invalid={!!formState.errors.label} {...register("label")} />
        </Field>
        <Field label="Expires" htmlFor="token-expiry" error={formState.errors.expiresInDays?.message} hint="After this the gateway API refuses it.">
          <select
            id="token-expiry"
            className={inputClass}
            aria-invalid={!!formState.errors.expiresInDays}
            {...register("expiresInDays", { setValueAs: (v: string | number | null) => (v === "" || v === null ? null : Number(v)) })}
          >
            <option value="">never (until revoked)</option>
            {TOKEN_DAYS_CHOICES.map((d) => (
              <option key={d} value={d}>
                after {d} days
              </option>
            ))}
          </select>
        </Field>
        <Button type="submit" className="sm:mt-6" disabled={formState.isSubmitting}>
          {formState.isSubmitting ? "Issuing…" : "Issue token"}
        </Button>
      </form>

      {tokens.length === 0 ? (
        <p className="text-label text-ink-faint">No tokens yet: this gateway cannot pull its bundle until one is issued and deployed.</p>
      ) : (
        <>
          <p className="mb-2 text-label text-ink-faint">
            {count.live} live, {count.expired > 0 ? `${count.expired} expired, ` : ""}
            {count.revoked} revoked
          </p>
          <div className="overflow-x-auto rounded-panel border border-panel-line">
            <table aria-label={`Tokens of ${gatewayName}`} className="text-label">
              <thead>
                <tr>
                  <th scope="col">Prefix</th>
                  <th scope="col">Label</th>
                  <th scope="col">State</th>
                  <th scope="col">Issued</th>
                  <th scope="col">Last used</th>
                  <th scope="col">
                    <span className="sr-only">Actions</span>
                  </th>
                </tr>
              </thead>
              <tbody>
                {tokens.map((t) => (
                  <tr key={t.id} data-testid={`token-${t.prefix}`}>
                    <td className="whitespace-nowrap font-mono">{t.prefix}…</td>
                    <td>{t.label || <span className="text-ink-faint">—</span>}</td>
                    <td>
                      {t.state === "live" ? (
                        <>
                          <span className="rounded bg-ok-soft px-1.5 py-0.5 text-micro font-medium text-ok">live</span>
                          {t.expiresAt ? <span className="mt-1 block text-micro text-ink-faint">expires {when(t.expiresAt)}</span> : null}
                        </>
                      ) : t.state === "expired" ? (
                        <>
                          <span className="rounded bg-caution-soft px-1.5 py-0.5 text-micro font-medium text-caution">expired</span>
                          <span className="mt-1 block text-micro text-ink-faint">{when(t.expiresAt!)}</span>
                        </>
                      ) : (
                        <>
                          <span className="rounded bg-panel-sunk px-1.5 py-0.5 text-micro font-medium text-ink-soft">revoked</span>
                          <span className="mt-1 block text-micro text-ink-faint">
                            {when(t.revokedAt!)} by {t.revokedBy}
                          </span>
                        </>
                      )}
                    </td>
                    <td className="whitespace-nowrap">
                      {when(t.createdAt)}
                      <span className="block text-micro text-ink-faint">by {t.createdBy}</span>
                    </td>
                    <td className="whitespace-nowrap">{t.lastUsedAt ? when(t.lastUsedAt) : <span className="text-ink-faint">never</span>}</td>
                    <td className="text-right">
                      {t.state === "revoked" ? null : <RevokeTokenButton site={site} gateway={gateway} gatewayName={gatewayName} token={t} lastLive={t.state === "live" && count.live === 1} />}
                    </td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        </>
      )}
    </section>
  );
}

type RevokeProps = { site: string; gateway: string; gatewayName: string; token: GatewayTokenView; lastLive: boolean };

function RevokeTokenButton({ site, gateway, gatewayName, token, lastLive }: Readonly<RevokeProps>) {
  const router = useRouter();
  return (
    <ConfirmButton
      label="Revoke"
      title={`Revoke token ${token.prefix}…?`}
      confirmLabel="Revoke token"
      onConfirm={async () => {
        const result = await revokeGatewayTokenAction({ site, gateway, tokenId: token.id });
        if (!result.ok) {
          showFailure(result);
          router.refresh();
          return false;
        }
        toast.success(`Token ${token.prefix}… revoked.`);
        router.refresh();
        return true;
      }}
    >
      {gatewayName} is refused with this token from its next request on. Revoking cannot be undone; the token stays listed as revoked.
      {lastLive ? (
        <strong className="mt-2 block font-medium text-fault">This is the gateway&apos;s last live token: it cannot pull its bundle until a new one is deployed.</strong>
      ) : null}
    </ConfirmButton>
  );
}
