"use client";

import { useRouter } from "next/navigation";
import { toast } from "sonner";
import { api } from "@/lib/client/api";

/** Moves a group one place up or down in the priority order. */
export function GroupOrderButtons({ site, order, index, name }: Readonly<{ site: string; order: number[]; index: number; name: string }>) {
  const router = useRouter();
  async function move(delta: number) {
    const next = [...order];
    const [id] = next.splice(index, 1);
    next.splice(index + delta, 0, id);
    try {
      await api(`/api/sites/${site}/groups/order`, { method: "PUT", json: { order: next } });
      toast.success(`${name} moved ${delta < 0 ? "up" : "down"}.`);
      router.refresh();
    } catch (e) {
      toast.error(`Not moved: ${e instanceof Error ? e.message : "the server did not answer"}`);
    }
  }
  return (
    <span className="flex gap-1">
      <button type="button" aria-label={`Move ${name} up`} disabled={index === 0} onClick={() => move(-1)} className="rounded border border-panel-line px-2 disabled:opacity-30">
        ↑
      </button>
      <button
        type="button"
        aria-label={`Move ${name} down`}
        disabled={index === order.length - 1}
        onClick={() => move(1)}
        className="rounded border border-panel-line px-2 disabled:opacity-30"
      >
        ↓
      </button>
    </span>
  );
}
