"use client";
/**
 * Mounts its children once the placeholder scrolls near the viewport, so the
 * panels below the fold (regime map, profile) do not delay the drawing's first
 * interaction on a large chip. The placeholder is focusable: a keyboard user
 * reaching it mounts the panel and lands on its first control.
 */
import { useEffect, useRef, useState, type ReactNode } from "react";

export function WhenVisible({ children, minHeight, label }: { children: ReactNode; minHeight: number; label: string }) {
  const ref = useRef<HTMLDivElement>(null);
  const wrapRef = useRef<HTMLDivElement>(null);
  const [shown, setShown] = useState(false);
  const focusAfterMount = useRef(false);

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

  useEffect(() => {
    if (!shown || !focusAfterMount.current) return;
    focusAfterMount.current = false;
    wrapRef.current?.querySelector<HTMLElement>("select, button, input, a[href], [tabindex]")?.focus();
  }, [shown]);

  if (shown) return <div ref={wrapRef}>{children}</div>;
  return (
    <div
      ref={ref}
      role="button"
      tabIndex={0}
      aria-label={label}
      onFocus={() => {
        focusAfterMount.current = true;
        setShown(true);
      }}
      onClick={() => setShown(true)}
      style={{ minHeight }}
      className="rounded-md border border-ink-200 bg-white p-3 text-xs text-ink-600"
    >
      {label}
    </div>
  );
}
