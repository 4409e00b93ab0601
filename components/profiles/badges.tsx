/** Small text markers: the word carries the meaning, the colour only repeats it. */
export function LossyBadge({ lossy }: Readonly<{ lossy: boolean }>) {
  return lossy ? (
    <span className="rounded bg-caution-soft px-1.5 py-0.5 text-micro text-caution" title="At least one step drops or replaces samples">
      lossy
    </span>
  ) : (
    <span className="rounded bg-ok-soft px-1.5 py-0.5 text-micro text-ok" title="Every step keeps the signal exactly">
      lossless
    </span>
  );
}

export function ArchivedBadge() {
  return <span className="rounded bg-panel-sunk px-1.5 py-0.5 text-micro text-ink-soft ring-1 ring-panel-line">archived</span>;
}

export function KindList({ kinds }: Readonly<{ kinds: readonly string[] }>) {
  return (
    <span className="flex flex-wrap gap-1">
      {kinds.map((k) => (
        <span key={k} className="rounded bg-weir-50 px-1.5 py-0.5 text-micro text-weir-700">
          {k}
        </span>
      ))}
    </span>
  );
}
