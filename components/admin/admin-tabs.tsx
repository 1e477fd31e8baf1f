import Link from "next/link";

const TABS = [
  { key: "members", label: "Members" },
  { key: "invitations", label: "Invitations" },
  { key: "outbox", label: "Mail outbox" },
] as const;

export function AdminTabs({ slug, current }: { slug: string; current: (typeof TABS)[number]["key"] }) {
  return (
    <nav aria-label="Admin sections" className="mb-6">
      <ul className="flex gap-1 border-b border-ink-200">
        {TABS.map((t) => (
          <li key={t.key}>
            <Link
              href={`/w/${slug}/admin/${t.key}`}
              aria-current={t.key === current ? "page" : undefined}
              className={`-mb-px block border-b-2 px-3 py-2 text-sm font-medium no-underline hover:no-underline ${
                t.key === current ? "border-stream-700 text-ink-900" : "border-transparent text-ink-600 hover:text-ink-900"
              }`}
            >
              {t.label}
            </Link>
          </li>
        ))}
      </ul>
    </nav>
  );
}
