import { can, type Actor, type Permission } from "@/lib/auth/permissions";

/**
 * The signed-in navigation. Each section appears to members whose roles grant
 * its permission — and only once its page exists (`ready`). Later areas add
 * their page, then set ready: true here.
 */
export type NavItem = { key: string; label: string; path: string; permission: Permission; ready: boolean };

export const NAV_ITEMS: readonly NavItem[] = [
  { key: "overview", label: "Overview", path: "", permission: "workspace.view", ready: true },
  { key: "chips", label: "Chips", path: "/chips", permission: "chip.view", ready: true },
  { key: "review", label: "Review queue", path: "/review", permission: "review.queue.view", ready: true },
  { key: "portfolio", label: "Portfolio", path: "/portfolio", permission: "portfolio.view", ready: true },
  { key: "inbox", label: "Inbox", path: "/inbox", permission: "workspace.view", ready: true },
  { key: "settings", label: "Settings", path: "/settings", permission: "settings.view", ready: true },
  { key: "admin", label: "Admin", path: "/admin/members", permission: "workspace.manage", ready: true },
];

/** The navigation entries this member sees in workspace `slug`, with their hrefs. */
export function navFor(actor: Actor, slug: string, items: readonly NavItem[] = NAV_ITEMS): { key: string; label: string; href: string }[] {
  return items
    .filter((i) => i.ready && can(actor, i.permission))
    .map((i) => ({ key: i.key, label: i.label, href: `/w/${slug}${i.path}` }));
}
