import type { ReactNode } from "react";

/** What to do next when there is nothing to show yet. */
export function EmptyState({ title, children, action }: { title: string; children: ReactNode; action?: ReactNode }) {
  return (
    <div className="rounded-lg border border-dashed border-ink-300 bg-white px-6 py-8">
      <h2 className="text-base font-semibold text-ink-900">{title}</h2>
      <div className="mt-2 max-w-prose text-sm text-ink-700">{children}</div>
      {action ? <div className="mt-4">{action}</div> : null}
    </div>
  );
}
