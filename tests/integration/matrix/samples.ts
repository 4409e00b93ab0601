import type { Gateway, Site } from "@/models";
import { createGateway, createSite } from "../../factories";

// One valid request per route and one valid input per server action, so that an allowed
// role gets a success and the matrix measures authorisation alone. Called once per role:
// samples that create records must make unique ones.

export type Fixture = { site: Site; gateway: Gateway };

export async function makeFixture(): Promise<Fixture> {
  const site = await createSite();
  const gateway = await createGateway(site);
  return { site, gateway };
}

type RouteSample = (fx: Fixture) => Promise<{ path: string; params?: Record<string, string>; body?: unknown }>;

export const ROUTE_SAMPLES: Record<string, RouteSample> = {
  "GET /api/health": async () => ({ path: "/api/health" }),
  "GET /api/me": async () => ({ path: "/api/me" }),
  "GET /api/sites": async () => ({ path: "/api/sites" }),
  "GET /api/sites/[site]": async (fx) => ({ path: `/api/sites/${fx.site.slug}`, params: { site: fx.site.slug } }),
  "GET /api/sites/[site]/gateways": async (fx) => ({
    path: `/api/sites/${fx.site.slug}/gateways`,
    params: { site: fx.site.slug },
  }),
};

export const ACTION_SAMPLES: Record<string, (fx: Fixture) => Promise<unknown>> = {};
