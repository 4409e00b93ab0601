"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { runAction } from "@/lib/actions";
import { createGateway, createSite, deleteGateway, deleteSite, updateGateway, updateSite } from "@/lib/data/site-writes";
import { assertWellFormedText } from "@/lib/http";
import type { GatewayInput, SiteInput } from "@/schemas/site";

const slug = z.string().min(1).max(64);
// What the client sends is checked as a whole first: it may be null, or hold text that is not Unicode.
const siteRef = z.object({ site: slug });
const gatewayRef = z.object({ site: slug, gateway: slug });
const checked = <T>(schema: z.ZodType<T>, input: unknown): T => {
  assertWellFormedText(input);
  return schema.parse(input);
};

function refresh() {
  revalidatePath("/", "layout");
}

// Create a site
export async function createSiteAction(input: SiteInput) {
  const result = await runAction("fleet.admin", (actor) => createSite(actor, checked(z.unknown(), input) as SiteInput));
  if (result.ok) refresh();
  return result;
}

// Replace a site's settings
export async function updateSiteAction(input: { site: string; values: SiteInput }) {
  const result = await runAction("fleet.admin", (actor) => {
    const { site, values } = checked(siteRef.extend({ values: z.unknown() }), input);
    return updateSite(actor, site, values as SiteInput);
  });
  if (result.ok) refresh();
  return result;
}

// Delete a site and its gateways (refused while releases need it)
export async function deleteSiteAction(input: { site: string }) {
  const result = await runAction("fleet.admin", (actor) => deleteSite(actor, checked(siteRef, input).site).then(() => null));
  if (result.ok) refresh();
  return result;
}

// Register a gateway at a site
export async function createGatewayAction(input: { site: string; values: GatewayInput }) {
  const result = await runAction("fleet.admin", (actor) => {
    const { site, values } = checked(siteRef.extend({ values: z.unknown() }), input);
    return createGateway(actor, site, values as GatewayInput);
  });
  if (result.ok) refresh();
  return result;
}

// Replace a gateway's settings
export async function updateGatewayAction(input: { site: string; gateway: string; values: GatewayInput }) {
  const result = await runAction("fleet.admin", (actor) => {
    const { site, gateway, values } = checked(gatewayRef.extend({ values: z.unknown() }), input);
    return updateGateway(actor, site, gateway, values as GatewayInput);
  });
  if (result.ok) refresh();
  return result;
}

// Delete a gateway (refused while releases need it)
export async function deleteGatewayAction(input: { site: string; gateway: string }) {
  const result = await runAction("fleet.admin", (actor) => {
    const { site, gateway } = checked(gatewayRef, input);
    return deleteGateway(actor, site, gateway).then(() => null);
  });
  if (result.ok) refresh();
  return result;
}
