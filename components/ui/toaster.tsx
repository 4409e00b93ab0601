"use client";

import { Toaster as SonnerToaster } from "sonner";

/** Saved / failed notices for writes, announced to screen readers. */
export function Toaster() {
  return <SonnerToaster position="bottom-right" richColors closeButton toastOptions={{ className: "font-sans text-body" }} />;
}
