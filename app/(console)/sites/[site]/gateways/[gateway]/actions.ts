"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { runAction } from "@/lib/actions";
import { createGatewayToken, revokeGatewayToken } from "@/lib/data/gateway-tokens";
import type { IssueTokenInput } from "@/schemas/gateway-token";

const slug = z.string().min(1).max(64);

const refresh = (site: string, gateway: string) => revalidatePath(`/sites/${site}/gateways/${gateway}`);

// Issue a token for a gateway; the token comes back once
export async function issueGatewayTokenAction(input: { site: string; gateway: string; values: IssueTokenInput }) {
  const result = await runAction("fleet.admin", (actor) => createGatewayToken(actor, slug.parse(input.site), slug.parse(input.gateway), input.values));
  if (result.ok) refresh(input.site, input.gateway);
  return result;
}

// Revoke one of a gateway's tokens (refused when it is already revoked)
export async function revokeGatewayTokenAction(input: { site: string; gateway: string; tokenId: number }) {
  const result = await runAction("fleet.admin", (actor) => revokeGatewayToken(actor, slug.parse(input.site), slug.parse(input.gateway), input.tokenId));
  if (result.ok) refresh(input.site, input.gateway);
  return result;
}
