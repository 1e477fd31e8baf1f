"use client";
import Link from "next/link";
import { usePathname } from "next/navigation";

/** Workspace sections; the current one is marked with aria-current for assistive tech and styled. */
export function MainNav({ items }: { items: { key: string; label: string; href: string }[] }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Workspace sections">
      <ul className="flex flex-wrap gap-1">
        {items.map((item) => {
          const current = item.key === "overview" ? pathname === item.href : pathname.startsWith(item.href.replace(/\/members$/, ""));
          return (
            <li key={item.key}>
              <Link
                href={item.href}
                data-nav={item.key}
                aria-current={current ? "page" : undefined}
                className={`block rounded-md px-3 py-2 text-sm font-medium no-underline hover:no-underline ${
                  current ? "bg-ink-800 text-white" : "text-ink-700 hover:bg-ink-100"
                }`}
              >
                {item.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
