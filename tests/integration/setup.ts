import { vi } from "vitest";

// Server modules import "server-only", which throws outside a React server bundle.
vi.mock("server-only", () => ({}));

// Server actions read the session cookie through next/headers; the tests hand them a
// real, signed session cookie through this jar (see tests/factories.ts).
vi.mock("next/headers", async () => {
  const jar = await import("./cookie-jar");
  return {
    cookies: async () => jar.currentJar(),
    headers: async () => new Headers(),
  };
});

// revalidatePath needs Next's request scope; outside it there is nothing to revalidate.
vi.mock("next/cache", () => ({ revalidatePath: () => undefined, revalidateTag: () => undefined }));
