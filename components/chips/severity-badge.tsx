/**
 * The worst flag of an analysis as a badge with a shape as well as a colour
 * (ring = note, triangle = check, diamond = must change; a dash for none), so
 * it reads in greyscale and for colour-blind viewers.
 */
const LOOK = {
  block: { label: "Must change", cls: "border-halt-600 bg-halt-100 text-halt-800", fill: "#b8321a" },
  warn: { label: "Check", cls: "border-heed-600 bg-heed-100 text-heed-800", fill: "#a86400" },
  info: { label: "Note", cls: "border-note-600 bg-note-100 text-note-800", fill: "#0b62b0" },
  none: { label: "No flags", cls: "border-stream-600 bg-stream-50 text-stream-800", fill: "#0c6a5c" },
} as const;

export type SeverityKey = keyof typeof LOOK;

export function asSeverityKey(value: string | null | undefined): SeverityKey | null {
  return value === "block" || value === "warn" || value === "info" || value === "none" ? value : null;
}

function Shape({ severity }: { severity: SeverityKey }) {
  const fill = LOOK[severity].fill;
  return (
    <svg width="12" height="12" viewBox="-6 -6 12 12" aria-hidden="true" className="shrink-0">
      {severity === "block" ? (
        <path d="M0,-5.5L5.5,0L0,5.5L-5.5,0Z" fill={fill} />
      ) : severity === "warn" ? (
        <path d="M0,-5L5.2,4.5L-5.2,4.5Z" fill={fill} />
      ) : severity === "info" ? (
        <circle r="3.8" fill="none" stroke={fill} strokeWidth="2.2" />
      ) : (
        <path d="M-4,0H4" stroke={fill} strokeWidth="2.2" strokeLinecap="round" />
      )}
    </svg>
  );
}

/** Badge for a worst-flag value ("block" | "warn" | "info" | "none"); null shows "Not analysed". */
export function SeverityBadge({ severity, count }: { severity: string | null | undefined; count?: number }) {
  const key = asSeverityKey(severity);
  if (!key) return <span className="text-sm text-ink-500">Not analysed</span>;
  const look = LOOK[key];
  return (
    <span className={`inline-flex items-center gap-1.5 whitespace-nowrap rounded-full border px-2 py-0.5 text-xs font-semibold ${look.cls}`} data-severity={key}>
      <Shape severity={key} />
      {look.label}
      {count !== undefined && key !== "none" ? <span className="font-normal">({count})</span> : null}
    </span>
  );
}

/** Sort rank: worse first. */
export const SEVERITY_RANK: Record<string, number> = { block: 0, warn: 1, info: 2, none: 3 };
