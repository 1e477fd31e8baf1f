"use client";
import { useEffect } from "react";

/** Unexpected failure while rendering: a plain message, never a stack trace. */
export default function ErrorPage({ error, reset }: { error: Error & { digest?: string }; reset: () => void }) {
  useEffect(() => {
    console.error(error);
  }, [error]);
  return (
    <main id="main" className="mx-auto max-w-xl px-4 py-16">
      <div className="panel p-8" role="alert">
        <h1 className="text-xl font-semibold">Something went wrong on our side</h1>
        <p className="mt-2 text-ink-700">The page could not be shown. Try again; if it keeps happening, tell your admin{error.digest ? ` (reference ${error.digest})` : ""}.</p>
        <button type="button" className="btn-primary mt-6" onClick={reset}>
          Try again
        </button>
      </div>
    </main>
  );
}
