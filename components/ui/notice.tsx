import type { ReactNode } from "react";

const tones = {
  info: "border-note-600 bg-note-100 text-note-800",
  success: "border-stream-600 bg-stream-50 text-stream-800",
  warning: "border-heed-600 bg-heed-100 text-heed-800",
  error: "border-halt-600 bg-halt-100 text-halt-800",
} as const;

/** A message box. Errors and warnings are announced to screen readers (role=alert); others politely. */
export function Notice({ tone = "info", title, children }: { tone?: keyof typeof tones; title?: string; children?: ReactNode }) {
  const urgent = tone === "error" || tone === "warning";
  return (
    <div role={urgent ? "alert" : "status"} className={`rounded-md border-l-4 px-4 py-3 text-sm ${tones[tone]}`}>
      {title ? <p className="font-semibold">{title}</p> : null}
      {children ? <div className={title ? "mt-1" : undefined}>{children}</div> : null}
    </div>
  );
}
