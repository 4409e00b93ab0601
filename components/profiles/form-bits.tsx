import type { ReactNode } from "react";
import { get, type FieldErrors } from "react-hook-form";
import type { ProfileDraft } from "./profile-draft";

/** The message at a field name, including an array's own error (react-hook-form keeps it under `root`). */
export function errorAt(errors: FieldErrors<ProfileDraft>, path: string): string | undefined {
  const e = path === "" ? errors : get(errors, path);
  if (!e || typeof e !== "object") return undefined;
  const own = (e as { message?: unknown }).message;
  if (typeof own === "string" && own) return own;
  const root = (e as { root?: { message?: unknown } }).root?.message;
  return typeof root === "string" && root ? root : undefined;
}

/** Ids for aria-describedby: the help text always, the error when there is one. */
export function describedBy(id: string, error: string | undefined, help = true): string | undefined {
  return [help ? `${id}-help` : null, error ? `${id}-error` : null].filter(Boolean).join(" ") || undefined;
}

export function ErrorText({ id, error }: Readonly<{ id: string; error: string | undefined }>) {
  return error ? (
    <p id={`${id}-error`} className="text-micro text-fault">
      {error}
    </p>
  ) : null;
}

export function HelpText({ id, children }: Readonly<{ id: string; children: ReactNode }>) {
  return (
    <p id={`${id}-help`} className="text-micro text-ink-faint">
      {children}
    </p>
  );
}
