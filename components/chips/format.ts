/** Display helpers shared by the chip pages (server and client). */

/** "3.2 MiB", "840 KiB", "512 B" (binary units, as file managers on Linux show). */
export function formatBytes(bytes: number): string {
  if (bytes >= 1048576) return `${(bytes / 1048576).toFixed(1)} MiB`;
  if (bytes >= 1024) return `${Math.round(bytes / 1024)} KiB`;
  return `${bytes} B`;
}

/** A date and time in UTC, unambiguous for a team across time zones: "2026-12-01 14:05 UTC" (with seconds for audit trails). */
export function formatWhen(value: string | Date, options: { seconds?: boolean } = {}): string {
  const d = typeof value === "string" ? new Date(value) : value;
  return `${d.toISOString().slice(0, options.seconds ? 19 : 16).replace("T", " ")} UTC`;
}

/** First 12 hex digits of a SHA-256, enough to tell files apart at a glance. */
export function shortSha(sha256: string): string {
  return sha256.slice(0, 12);
}

export function chipHref(slug: string, chipId: number): string {
  return `/w/${slug}/chips/${chipId}`;
}

export function revisionHref(slug: string, chipId: number, number: number): string {
  return `/w/${slug}/chips/${chipId}/revisions/${number}`;
}

export function analysisHref(slug: string, chipId: number, number: number, analysisId: number): string {
  return `${revisionHref(slug, chipId, number)}/analyses/${analysisId}`;
}
