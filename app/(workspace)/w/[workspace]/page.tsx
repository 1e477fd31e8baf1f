import Link from "next/link";
import type { Metadata } from "next";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { getPageAccess } from "@/lib/auth/page";
import { navFor } from "@/components/shell/nav-items";
import type { Role } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Overview" };

/**
 * What each role does here, and where to go next: `next` names a navigation
 * section; its button appears only when that section exists for this member.
 */
const ROLE_GUIDE: Record<Role, { title: string; body: string; next?: { nav: string; label: string } }> = {
  admin: {
    title: "Bring your team in",
    body: "Invite designers, fluidics reviewers, fab liaisons and leads by e-mail. Each invitation carries the roles that decide what the person can see and do.",
    next: { nav: "admin", label: "Invite a member" },
  },
  designer: {
    title: "Check a layout before it goes to the fab",
    body: "Upload a chip layout as DXF, map its layers to channels and ports, and set operating points; Stokeline solves the channel hydraulics and flags flow-regime risks before you pay for a mask.",
    next: { nav: "chips", label: "Go to chips" },
  },
  fluidics_reviewer: {
    title: "Review the regime flags",
    body: "When a designer submits a revision, go through each regime flag and either accept it with a written justification or mark it must-fix.",
    next: { nav: "review", label: "Open the review queue" },
  },
  fab_liaison: {
    title: "Clear revisions for tape-out",
    body: "Once fluidics review has passed, check the revision against your fab's rules and, when it is fit to build, clear it for tape-out with your signature.",
    next: { nav: "review", label: "Open the review queue" },
  },
  lead: {
    title: "Follow the portfolio",
    body: "See which chips are on track for tape-out, what changed between revisions and which risks were accepted, and download a brief to send to partners.",
    next: { nav: "portfolio", label: "Open the portfolio" },
  },
};

export default async function WorkspaceHome({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "workspace.view");
  if (!access.ok) return <AccessDenied message={access.message} />;
  const { scope, workspace, user } = access;
  const sections = new Map(navFor(scope, slug).map((i) => [i.key, i.href]));
  const nextHref = (role: Role): string | undefined => {
    const next = ROLE_GUIDE[role].next;
    if (!next || !sections.has(next.nav)) return undefined;
    return next.nav === "admin" ? `/w/${slug}/admin/invitations` : sections.get(next.nav);
  };
  return (
    <>
      <PageHeader
        title={workspace.name}
        lead={`Signed in as ${user.name}. Here is where your part of the path from layout to tape-out starts.`}
      />
      <div className="grid gap-4 md:grid-cols-2" data-testid="role-guides">
        {scope.roles.map((role) => (
          <EmptyState
            key={role}
            title={ROLE_GUIDE[role].title}
            action={
              nextHref(role) ? (
                <Link className="btn-primary" href={nextHref(role)!}>
                  {ROLE_GUIDE[role].next!.label}
                </Link>
              ) : undefined
            }
          >
            <p>{ROLE_GUIDE[role].body}</p>
          </EmptyState>
        ))}
        {scope.roles.length === 0 ? (
          <EmptyState title="You hold no role here yet">
            <p>Ask an admin of {workspace.name} to give you a role; until then you can only see this page.</p>
          </EmptyState>
        ) : null}
      </div>
      <section aria-labelledby="cautions-heading" className="mt-10">
        <h2 id="cautions-heading" className="text-sm font-semibold uppercase tracking-wide text-ink-600">
          Before you rely on any figure
        </h2>
        <ul className="mt-2 list-disc space-y-1 pl-5 text-sm text-ink-700">
          {MODEL_CAUTIONS.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>
    </>
  );
}
