import "server-only";
import { NextResponse } from "next/server";
import { ConnectionError, DatabaseError, ForeignKeyConstraintError, UniqueConstraintError, ValidationError as SequelizeValidationError } from "sequelize";
import { ZodError } from "zod";
import { env } from "@/lib/env";
import { checkCrossSite } from "@/lib/security/origin";
import { idSchema } from "@/schemas/site";

/** An error that knows its HTTP status and, for bad input, the field at fault. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    message: string,
    readonly field?: string,
    readonly headers?: Record<string, string>,
    readonly issues?: { field: string; message: string }[],
  ) {
    super(message);
  }
}

/**
 * An id from the URL (a path parameter or a query parameter): a positive integer, else a 422
 * naming `field` — the same word a 404 for that record names ("group", "profile", …).
 */
export function urlId(value: string | null | undefined, field: string): number {
  const parsed = idSchema.safeParse(value);
  if (parsed.success) return parsed.data;
  throw new ZodError(parsed.error.issues.map((i) => ({ ...i, path: [field, ...i.path] })));
}

export type ErrorBody = { error: string; field?: string; issues?: { field: string; message: string }[] };

/** Maps any thrown value to a status and a JSON body; never leaks a stack trace. */
export function describeError(err: unknown): { status: number; body: ErrorBody; headers?: Record<string, string> } {
  if (err instanceof HttpError) {
    const issues = err.issues;
    return {
      status: err.status,
      body: { error: err.message, ...(err.field ? { field: err.field } : {}), ...(issues ? { issues } : {}) },
      headers: err.headers,
    };
  }
  if (err instanceof ZodError) {
    const issues = err.issues.map((i) => ({ field: i.path.join(".") || "body", message: i.message }));
    return { status: 422, body: { error: `${issues[0].field}: ${issues[0].message}`, field: issues[0].field, issues } };
  }
  if (err instanceof UniqueConstraintError) {
    const keys = Object.keys(err.fields ?? {});
    const column = keys.map((k) => UNIQUE_INDEX_FIELDS[k] ?? k).filter((k) => k !== "site_id").pop() ?? "unknown";
    const what = UNIQUE_INDEX_WHAT[keys[0]] ?? column.replace(/_/g, " ");
    return { status: 409, body: { error: `that ${what} is already taken`, field: camel(column) } };
  }
  if (err instanceof ForeignKeyConstraintError) {
    return { status: 409, body: { error: "the record is still referenced by other records" } };
  }
  if (err instanceof SequelizeValidationError) {
    const first = err.errors[0];
    return { status: 422, body: { error: first?.message ?? "invalid input", field: first?.path ?? undefined } };
  }
  const errno = (err as { parent?: { errno?: number } })?.parent?.errno;
  if (err instanceof DatabaseError && (errno === 1213 || errno === 1205)) {
    return { status: 409, body: { error: "a concurrent change got in the way; reload and try again" }, headers: { "Retry-After": "1" } };
  }
  if (err instanceof ConnectionError || (err instanceof DatabaseError && lostConnection(err))) {
    return { status: 503, body: { error: "the database is unavailable; try again shortly" }, headers: { "Retry-After": "5" } };
  }
  if (err instanceof DatabaseError && errno !== undefined && DATA_ERRORS[errno]) return dataError(err, DATA_ERRORS[errno]);
  console.error(err);
  return { status: 500, body: { error: "internal error" } };
}

// A value a schema let through but the column cannot hold: bad input, never a server fault.
const DATA_ERRORS: Record<number, string> = {
  1406: "is too long to be stored",
  1264: "is out of the range that can be stored",
  1366: "is not a value that can be stored there",
  1292: "is not a date or time that can be stored",
  4025: "breaks the stored data's rule",
};

/** 422 naming the column (camelCase, as the body names it) or, for a CHECK constraint, the rule. */
function dataError(err: DatabaseError, what: string): { status: number; body: ErrorBody } {
  const message = (err as { parent?: { sqlMessage?: string } }).parent?.sqlMessage ?? err.message;
  const column = /column (?:`[^`]*`\.)*[`']([^`']+)[`']/.exec(message)?.[1];
  const rule = /CONSTRAINT `([^`]+)`/.exec(message)?.[1];
  const field = column ? camel(column) : undefined;
  return { status: 422, body: { error: `${field ?? "a value"} ${what}${rule ? ` (${rule})` : ""}`, ...(field ? { field } : {}) } };
}

/** A query that failed because the connection to the database broke (the server went away mid-request). */
function lostConnection(err: DatabaseError): boolean {
  const parent = (err as { parent?: { fatal?: boolean; code?: string; errno?: number } }).parent;
  if (!parent) return false;
  if (parent.fatal === true) return true;
  return ["ECONNREFUSED", "ECONNRESET", "EPIPE", "ER_SOCKET_UNEXPECTED_CLOSE", "ER_CONNECTION_ALREADY_CLOSED", "ER_GET_CONNECTION_TIMEOUT", "ER_CONNECTION_TIMEOUT"].includes(parent.code ?? "")
    || parent.errno === 2006 || parent.errno === 2013 || parent.errno === 1927;
}

// Composite unique indexes, by name: the column the person typed, and what to call it.
const UNIQUE_INDEX_FIELDS: Record<string, string> = { tags_site_name: "name", tag_groups_site_name: "name", profiles_name_unique: "name" };
const UNIQUE_INDEX_WHAT: Record<string, string> = {
  tags_site_name: "tag name (at this site)",
  tag_groups_site_name: "group name (at this site)",
  profiles_name_unique: "profile name",
};

function camel(s: string) {
  return s.replace(/_([a-z])/g, (_, c: string) => c.toUpperCase());
}

export function errorResponse(err: unknown): NextResponse {
  const { status, body, headers } = describeError(err);
  return NextResponse.json(body, { status, headers });
}

/**
 * Wraps a route handler so every failure becomes a JSON error with the right status, and
 * refuses cross-site state changes (403, field "origin") before the handler runs. The
 * check lives here rather than in proxy.ts: every API handler passes through route(), the
 * proxy does not run on the API (the gateway's hot path), and it is not a boundary.
 */
export function route<Ctx>(fn: (req: Request, ctx: Ctx) => Promise<Response>) {
  return async (req: Request, ctx: Ctx): Promise<Response> => {
    try {
      const verdict = checkCrossSite(req, env().NEXTAUTH_URL);
      if (!verdict.ok) throw new HttpError(403, verdict.reason, "origin");
      return await fn(req, ctx);
    } catch (err) {
      return errorResponse(err);
    }
  };
}

/** Reads a JSON body, refusing a body that is not JSON with 400 and text that is not Unicode with 422. */
export async function readJson(req: Request): Promise<unknown> {
  let body: unknown;
  try {
    body = await req.json();
  } catch {
    throw new HttpError(400, "the request body must be JSON", "body");
  }
  assertWellFormedText(body);
  return body;
}

// JSON can spell an unpaired UTF-16 surrogate ("\ud800"), but it is no Unicode character:
// the driver would store it as U+FFFD and a JSON column (the audit log) refuses it.
const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/** Refuses (422, naming the field) a parsed JSON value whose keys or strings hold a lone surrogate. */
export function assertWellFormedText(value: unknown): void {
  type Node = { v: unknown; key?: string | number; up?: Node };
  const stack: Node[] = [{ v: value }];
  const fail = (node: Node) => {
    const path: (string | number)[] = [];
    for (let n: Node | undefined = node; n?.key !== undefined; n = n.up) path.unshift(n.key);
    const field = path.join(".") || "body";
    return new HttpError(422, `${field}: the text is not valid Unicode (it holds a lone surrogate)`, field);
  };
  while (stack.length > 0) {
    const node = stack.pop()!;
    if (typeof node.v === "string") {
      if (LONE_SURROGATE.test(node.v)) throw fail(node);
    } else if (node.v !== null && typeof node.v === "object") {
      const entries = Object.entries(node.v);
      for (let i = entries.length - 1; i >= 0; i--) {
        const [k, v] = entries[i];
        const child: Node = { v, key: Array.isArray(node.v) ? Number(k) : k, up: node };
        if (LONE_SURROGATE.test(k)) throw fail(child);
        stack.push(child);
      }
    }
  }
}

/**
 * Reads a JSON body of at most `limit` bytes: 413 when Content-Length says more or the
 * stream runs past the limit (read no further), 400 when it is not JSON, 422 when its
 * text is not Unicode.
 */
export async function readJsonLimited(req: Request, limit: number): Promise<unknown> {
  const declared = req.headers.get("content-length");
  if (declared !== null && Number(declared) > limit) throw tooLarge(limit);
  const chunks: Uint8Array[] = [];
  let size = 0;
  if (req.body) {
    const reader = req.body.getReader();
    for (;;) {
      const { done, value } = await reader.read();
      if (done) break;
      size += value.byteLength;
      if (size > limit) {
        await reader.cancel().catch(() => undefined);
        throw tooLarge(limit);
      }
      chunks.push(value);
    }
  }
  let body: unknown;
  try {
    body = JSON.parse(Buffer.concat(chunks).toString("utf8"));
  } catch {
    throw new HttpError(400, "the request body must be JSON", "body");
  }
  assertWellFormedText(body);
  return body;
}

const tooLarge = (limit: number) => new HttpError(413, `the request body is larger than ${Math.round(limit / 1024)} KiB`, "body");
