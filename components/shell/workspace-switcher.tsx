import Link from "next/link";

/**
 * Switches between the member's workspaces. A native <details> disclosure:
 * keyboard- and screen-reader-friendly without client JavaScript.
 */
export function WorkspaceSwitcher({ current, workspaces }: { current: { slug: string; name: string }; workspaces: { slug: string; name: string }[] }) {
  if (workspaces.length < 2) {
    return <span className="text-sm font-semibold text-ink-800">{current.name}</span>;
  }
  return (
    <details className="relative" data-testid="workspace-switcher">
      <summary className="cursor-pointer list-none rounded-md border border-ink-300 bg-white px-3 py-1.5 text-sm font-semibold text-ink-800 hover:bg-ink-100">
        <span className="sr-only">Current workspace: </span>
        {current.name} <span aria-hidden="true">▾</span>
      </summary>
      <ul className="absolute left-0 z-20 mt-1 min-w-56 rounded-md border border-ink-200 bg-white py-1 shadow-lg" aria-label="Switch workspace">
        {workspaces.map((w) => (
          <li key={w.slug}>
            <Link
              href={`/w/${w.slug}`}
              aria-current={w.slug === current.slug ? "true" : undefined}
              className="block px-3 py-2 text-sm text-ink-800 no-underline hover:bg-ink-100 hover:no-underline aria-[current]:font-semibold"
            >
              {w.name}
            </Link>
          </li>
        ))}
      </ul>
    </details>
  );
}
