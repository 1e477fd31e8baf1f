import type { ReactNode } from "react";
import { AppShell } from "@/components/shell/app-shell";
import { navFor } from "@/components/shell/nav-items";
import { AccessDenied } from "@/components/ui/access-denied";
import { Wordmark } from "@/components/ui/logo";
import { listWorkspacesForUser } from "@/db/queries/workspaces";
import { requirePageUser } from "@/lib/auth/page";

export default async function WorkspaceLayout({ children, params }: { children: ReactNode; params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const user = await requirePageUser(`/w/${slug}`);
  const workspaces = await listWorkspacesForUser(user.id);
  const current = workspaces.find((w) => w.slug === slug);
  if (!current) {
    return (
      <div className="min-h-screen px-4 py-8">
        <Wordmark />
        <AccessDenied message="You are not a member of that workspace." homeHref="/" />
      </div>
    );
  }
  const nav = navFor({ userId: user.id, workspaceId: current.id, roles: current.roles }, slug);
  return (
    <AppShell user={user} roles={current.roles} workspace={current} workspaces={workspaces} nav={nav}>
      {children}
    </AppShell>
  );
}
