"use client";

import { signOut } from "next-auth/react";

export function SignOutButton() {
  return (
    <button
      type="button"
      onClick={() => signOut({ callbackUrl: "/sign-in" })}
      className="rounded-panel px-2 py-1.5 min-h-9 text-label text-ink-soft hover:bg-panel-sunk"
    >
      Sign out
    </button>
  );
}
