"use client";

import { useEffect, useState } from "react";
import type { CallKind, Calls, Reply, Setup } from "./worker-protocol";

/** Promise-based calls to the preview worker; a later call of the same kind makes earlier answers stale. */
export type PreviewClient = {
  call<K extends CallKind>(kind: K, payload: Calls[K]["req"]): Promise<Calls[K]["res"]>;
  terminate(): void;
};

/** Thrown for an answer that a later call of the same kind has replaced. */
export class StaleAnswer extends Error {}

const spawn = (name: string) => new Worker(new URL("./preview.worker.ts", import.meta.url), { type: "module", name });

/**
 * The preview worker and, on a machine with more than one core, up to three sweep helpers
 * (same script) wired to it by their own message channels.
 */
export function createPreviewClient(): PreviewClient {
  const worker = spawn("sluice-preview");
  const cores = typeof navigator === "undefined" ? 1 : navigator.hardwareConcurrency || 1;
  const helpers = Array.from({ length: Math.min(3, Math.max(0, cores - 1)) }, (_, k) => spawn(`sluice-sweep-helper-${k + 1}`));
  for (const h of helpers) {
    const channel = new MessageChannel();
    h.postMessage({ setup: "helper", port: channel.port2 } satisfies Setup, [channel.port2]);
    worker.postMessage({ setup: "attach", port: channel.port1 } satisfies Setup, [channel.port1]);
  }
  const pending = new Map<number, { kind: CallKind; resolve: (v: unknown) => void; reject: (e: Error) => void }>();
  const latest = new Map<CallKind, number>();
  let next = 1;
  worker.onmessage = (e: MessageEvent<Reply>) => {
    const r = e.data;
    const p = pending.get(r.id);
    if (!p) return;
    pending.delete(r.id);
    if (latest.get(p.kind) !== r.id) p.reject(new StaleAnswer("superseded"));
    else if (r.ok) p.resolve(r.result);
    else p.reject(new Error(r.error));
  };
  worker.onerror = (e) => {
    for (const p of pending.values()) p.reject(new Error(e.message || "The preview worker stopped."));
    pending.clear();
  };
  return {
    call(kind, payload) {
      const id = next++;
      latest.set(kind, id);
      return new Promise((resolve, reject) => {
        pending.set(id, { kind, resolve: resolve as (v: unknown) => void, reject });
        worker.postMessage({ id, kind, payload });
      });
    },
    terminate: () => {
      worker.terminate();
      for (const h of helpers) h.terminate();
    },
  };
}

/** One preview worker for the component's lifetime. */
export function usePreviewClient(): PreviewClient | null {
  const [client, setClient] = useState<PreviewClient | null>(null);
  useEffect(() => {
    const c = createPreviewClient();
    setClient(c);
    return () => c.terminate();
  }, []);
  return client;
}
