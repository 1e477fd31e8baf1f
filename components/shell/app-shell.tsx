import Link from "next/link";
import type { ReactNode } from "react";
import { Logo } from "@/components/ui/logo";
import { RoleBadge } from "@/components/ui/role-badge";
import type { Role } from "@/lib/auth/roles";
import { MainNav } from "./main-nav";
import { SignOutButton } from "./sign-out-button";
import { WorkspaceSwitcher } from "./workspace-switcher";

type ShellProps = {
  user: { name: string; email: string };
  roles: Role[];
  workspace: { slug: string; name: string };
  workspaces: { slug: string; name: string }[];
  nav: { key: string; label: string; href: string }[];
  children: ReactNode;
};

/** The signed-in frame: brand, workspace switcher, the member's roles, sections, and sign-out. */
export function AppShell({ user, roles, workspace, workspaces, nav, children }: ShellProps) {
  return (
    <div className="min-h-screen">
      <a href="#main" className="sr-only focus:not-sr-only focus:absolute focus:left-2 focus:top-2 focus:z-50 focus:rounded focus:bg-white focus:px-3 focus:py-2">
        Skip to content
      </a>
      <header className="border-b border-ink-200 bg-white">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-3 px-4 py-3">
          <Link href={`/w/${workspace.slug}`} className="inline-flex items-center gap-2 font-semibold text-ink-900 no-underline hover:no-underline">
            <Logo />
            <span className="text-lg tracking-tight">Stokeline</span>
          </Link>
          <WorkspaceSwitcher current={workspace} workspaces={workspaces} />
          <div className="ml-auto flex items-center gap-3">
            <div className="text-right leading-tight">
              <p className="text-sm font-medium text-ink-900" data-testid="user-name">
                {user.name}
              </p>
              <p className="flex flex-wrap justify-end gap-1 pt-0.5" data-testid="user-roles">
                {roles.map((r) => (
                  <RoleBadge key={r} role={r} />
                ))}
              </p>
            </div>
            <SignOutButton />
          </div>
        </div>
        <div className="mx-auto max-w-6xl px-4 pb-2">
          <MainNav items={nav} />
        </div>
      </header>
      <main id="main" className="mx-auto max-w-6xl px-4 py-8">
        {children}
      </main>
    </div>
  );
}
