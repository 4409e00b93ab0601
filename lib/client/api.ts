// Client-side calls to the console's route handlers, with the error body the server sends.

export type ApiError = { status: number; error: string; field?: string; issues?: { field: string; message: string }[] };

export class ApiFailure extends Error {
  constructor(readonly detail: ApiError) {
    super(detail.error);
  }
}

export async function api<T>(url: string, init: RequestInit & { json?: unknown } = {}): Promise<T> {
  const { json, ...rest } = init;
  const res = await fetch(url, {
    ...rest,
    headers: { ...(json !== undefined ? { "content-type": "application/json" } : {}), ...rest.headers },
    body: json !== undefined ? JSON.stringify(json) : rest.body,
  });
  if (res.status === 204) return undefined as T;
  const body = await res.json().catch(() => ({ error: `the server answered ${res.status}` }));
  if (!res.ok) throw new ApiFailure({ status: res.status, ...body });
  return body as T;
}

export const fetcher = <T,>(url: string) => api<T>(url);
