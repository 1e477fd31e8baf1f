/** Keeps a post-sign-in destination on this site: only "/..." paths, never "//host" or absolute URLs. */
export function safeCallbackPath(value: unknown, fallback = "/"): string {
  if (typeof value !== "string" || value.length > 500) return fallback;
  if (!value.startsWith("/") || value.startsWith("//") || value.startsWith("/\\")) return fallback;
  return value;
}
