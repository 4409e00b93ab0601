"use server";

import { revalidatePath } from "next/cache";
import { z } from "zod";
import { runAction } from "@/lib/actions";
import { createGateway, createSite, deleteGateway, deleteSite, updateGateway, updateSite } from "@/lib/data/site-writes";
import type { GatewayInput, SiteInput } from "@/schemas/site";

const slug = z.string().min(1).max(64);

function refresh() {
  revalidatePath("/", "layout");
}

// Create a site
export async function createSiteAction(input: SiteInput) {
  const result = await runAction("fleet.admin", (actor) => createSite(actor, input));
  if (result.ok) refresh();
  return result;
}

// Replace a site's settings
export async function updateSiteAction(input: { site: string; values: SiteInput }) {
  const result = await runAction("fleet.admin", (actor) => updateSite(actor, slug.parse(input.site), input.values));
  if (result.ok) refresh();
  return result;
}

// Delete a site and its gateways (refused while releases need it)
export async function deleteSiteAction(input: { site: string }) {
  const result = await runAction("fleet.admin", (actor) => deleteSite(actor, slug.parse(input.site)).then(() => null));
  if (result.ok) refresh();
  return result;
}

// Register a gateway at a site
export async function createGatewayAction(input: { site: string; values: GatewayInput }) {
  const result = await runAction("fleet.admin", (actor) => createGateway(actor, slug.parse(input.site), input.values));
  if (result.ok) refresh();
  return result;
}

// Replace a gateway's settings
export async function updateGatewayAction(input: { site: string; gateway: string; values: GatewayInput }) {
  const result = await runAction("fleet.admin", (actor) =>
    updateGateway(actor, slug.parse(input.site), slug.parse(input.gateway), input.values),
  );
  if (result.ok) refresh();
  return result;
}

// Delete a gateway (refused while releases need it)
export async function deleteGatewayAction(input: { site: string; gateway: string }) {
  const result = await runAction("fleet.admin", (actor) =>
    deleteGateway(actor, slug.parse(input.site), slug.parse(input.gateway)).then(() => null),
  );
  if (result.ok) refresh();
  return result;
}
