"use client";
/**
 * Mounts its children once the placeholder scrolls near the viewport, so the
 * panels below the fold (regime map, profile) do not delay the drawing's first
 * interaction on a large chip. The placeholder keeps the panel's height, so
 * nothing jumps when it mounts.
 */
import { useEffect, useRef, useState, type ReactNode } from "react";

export function WhenVisible({ children, minHeight, label }: { children: ReactNode; minHeight: number; label: string }) {
  const ref = useRef<HTMLDivElement>(null);
  const [shown, setShown] = useState(false);
  useEffect(() => {
    const el = ref.current;
    if (!el || shown) return;
    if (typeof IntersectionObserver === "undefined") {
      setShown(true);
      return;
    }
    const io = new IntersectionObserver((entries) => {
      if (entries.some((e) => e.isIntersecting)) setShown(true);
    }, { rootMargin: "200px" });
    io.observe(el);
    return () => io.disconnect();
  }, [shown]);
  if (shown) return <>{children}</>;
  return (
    <div ref={ref} style={{ minHeight }} className="rounded-md border border-ink-200 bg-white p-3 text-xs text-ink-600" aria-busy="true">
      {label}
    </div>
  );
}
