"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { runAction } from "@/lib/actions";
import { createGatewayToken, revokeGatewayToken } from "@/lib/data/gateway-tokens";
import { assertWellFormedText } from "@/lib/http";
import type { IssueTokenInput } from "@/schemas/gateway-token";

const slug = z.string().min(1).max(64);
// What the client sends is checked as a whole first: it may be null, or hold text that is not Unicode.
const gatewayRef = z.object({ site: slug, gateway: slug });
const checked = <T>(schema: z.ZodType<T>, input: unknown): T => {
  assertWellFormedText(input);
  return schema.parse(input);
};

const refresh = (site: string, gateway: string) => revalidatePath(`/sites/${site}/gateways/${gateway}`);

// Issue a token for a gateway; the token comes back once
export async function issueGatewayTokenAction(input: { site: string; gateway: string; values: IssueTokenInput }) {
  const result = await runAction("fleet.admin", (actor) => {
    const { site, gateway, values } = checked(gatewayRef.extend({ values: z.unknown() }), input);
    return createGatewayToken(actor, site, gateway, values as IssueTokenInput);
  });
  if (result.ok) refresh(input.site, input.gateway);
  return result;
}

// Revoke one of a gateway's tokens (refused when it is already revoked)
export async function revokeGatewayTokenAction(input: { site: string; gateway: string; tokenId: number }) {
  const result = await runAction("fleet.admin", (actor) => {
    const { site, gateway, tokenId } = checked(gatewayRef.extend({ tokenId: z.unknown() }), input);
    return revokeGatewayToken(actor, site, gateway, tokenId as number);
  });
  if (result.ok) refresh(input.site, input.gateway);
  return result;
}
