import Link from "next/link";
import type { Metadata } from "next";
import { AccessDenied } from "@/components/ui/access-denied";
import { EmptyState } from "@/components/ui/empty-state";
import { PageHeader } from "@/components/ui/page-header";
import { MODEL_CAUTIONS } from "@/lib/analysis/cautions";
import { getPageAccess } from "@/lib/auth/page";
import { can } from "@/lib/auth/permissions";
import type { Role } from "@/lib/auth/roles";

export const metadata: Metadata = { title: "Overview" };

/** What each role does here, and the next step open to them today. */
const ROLE_GUIDE: Record<Role, { title: string; body: string }> = {
  admin: {
    title: "Bring your team in",
    body: "Invite designers, fluidics reviewers, fab liaisons and leads by e-mail. Each invitation carries the roles that decide what the person can see and do.",
  },
  designer: {
    title: "Your chip layouts will live here",
    body: "As a device designer you will upload a chip layout as DXF, map its layers to channels and ports, and set operating points; Stokeline then solves the channel hydraulics and flags flow-regime risks before you pay for a mask.",
  },
  fluidics_reviewer: {
    title: "Nothing waits for your review",
    body: "When a designer submits a revision, you will go through each regime flag and either accept it with a written justification or mark it must-fix.",
  },
  fab_liaison: {
    title: "Nothing waits for clearance",
    body: "Once fluidics review has passed, you will check the revision against your fab's rules and, when it is fit to build, clear it for tape-out with your signature.",
  },
  lead: {
    title: "No chips to summarise yet",
    body: "You will see which chips are on track for tape-out, what changed between revisions and which risks were accepted, and download a brief to send to partners.",
  },
};

export default async function WorkspaceHome({ params }: { params: Promise<{ workspace: string }> }) {
  const { workspace: slug } = await params;
  const access = await getPageAccess(slug, "workspace.view");
  if (!access.ok) return <AccessDenied message={access.message} />;
  const { scope, workspace, user } = access;
  const isAdmin = can(scope, "workspace.manage");
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
              role === "admin" && isAdmin ? (
                <Link className="btn-primary" href={`/w/${slug}/admin/invitations`}>
                  Invite a member
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
