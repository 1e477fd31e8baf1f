import type { ReactNode } from "react";
import { Wordmark } from "@/components/ui/logo";

/** Signed-out pages: one calm column with the brand and a short statement of the job. */
export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="min-h-screen bg-gradient-to-b from-ink-100 to-ink-50">
      <main id="main" className="mx-auto flex max-w-md flex-col px-4 py-12">
        <Wordmark />
        <p className="mt-2 text-sm text-ink-600">Channel hydraulics, flow regime and sign-off for microfluidic chips — before the mask is paid for.</p>
        <div className="panel mt-8 p-8">{children}</div>
      </main>
    </div>
  );
}
