"use client";
import { signOut } from "next-auth/react";
import { useState } from "react";

export function SignOutButton() {
  const [busy, setBusy] = useState(false);
  return (
    <button
      type="button"
      className="btn-quiet px-3 py-1.5"
      disabled={busy}
      onClick={() => {
        setBusy(true);
        void signOut({ callbackUrl: "/sign-in?notice=signed-out" });
      }}
    >
      {busy ? "Signing out…" : "Sign out"}
    </button>
  );
}
