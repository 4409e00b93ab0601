"use client";

import { Button } from "@/components/ui/button";

export default function ConsoleError({ error, reset }: Readonly<{ error: Error & { digest?: string }; reset: () => void }>) {
  return (
    <div role="alert" className="rounded-panel border border-fault bg-fault-soft p-6">
      <h1 className="text-title text-fault">This page could not be shown</h1>
      <p className="mt-2 text-ink-soft">
        The server could not finish the request. If the database is restarting, try again in a few seconds.
        {error.digest ? <span className="ml-1 font-mono text-micro">(reference {error.digest})</span> : null}
      </p>
      <Button className="mt-4" onClick={reset}>
        Try again
      </Button>
    </div>
  );
}
