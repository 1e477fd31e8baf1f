import "server-only";
/**
 * Demo data: the invented startup Brookmere Biofluidics (one member per role)
 * and a second invented company, Halvard Microsystems, so cross-workspace
 * refusals can be shown. All names are invented. Passwords are local-only demo
 * passwords (README).
 *
 * Extending: later areas add a step to SEED_STEPS (e.g. demo chips and their
 * analyses); each step receives the DemoContext with the ids created here.
 */
import path from "node:path";
import { fileURLToPath } from "node:url";
import { eq } from "drizzle-orm";
import { closeDb, getDb } from "./index";
import { membershipRoles, memberships, users, workspaces } from "./schema";
import { insertAuditEvent } from "./queries/audit";
import { hashPassword } from "@/lib/auth/password";
import type { Role } from "@/lib/auth/roles";
import { seedChipsStep } from "./seed-chips";
import { seedReviewStep } from "./seed-review";

/** The one local-only password of every demo account. */
export const DEMO_PASSWORD = "stokeline-demo";

type DemoPerson = { email: string; name: string; memberships: { workspace: "brookmere" | "halvard"; roles: Role[] }[] };

export const DEMO_WORKSPACES = {
  brookmere: { slug: "brookmere", name: "Brookmere Biofluidics" },
  halvard: { slug: "halvard", name: "Halvard Microsystems" },
} as const;

export const DEMO_PEOPLE: DemoPerson[] = [
  { email: "admin@brookmere.test", name: "Maren Ostby", memberships: [{ workspace: "brookmere", roles: ["admin"] }] },
  { email: "designer@brookmere.test", name: "Tobiah Quill", memberships: [{ workspace: "brookmere", roles: ["designer"] }] },
  { email: "designer2@brookmere.test", name: "Esme Laurentin", memberships: [{ workspace: "brookmere", roles: ["designer"] }] },
  { email: "reviewer@brookmere.test", name: "Ilse Varga", memberships: [{ workspace: "brookmere", roles: ["fluidics_reviewer"] }] },
  {
    email: "fab@brookmere.test",
    name: "Dario Penwright",
    memberships: [
      { workspace: "brookmere", roles: ["fab_liaison"] },
      { workspace: "halvard", roles: ["fab_liaison"] },
    ],
  },
  { email: "lead@brookmere.test", name: "Sunniva Holt", memberships: [{ workspace: "brookmere", roles: ["lead"] }] },
  { email: "admin@halvard.test", name: "Piet Ramsauer", memberships: [{ workspace: "halvard", roles: ["admin"] }] },
  { email: "designer@halvard.test", name: "Noor Eskildsen", memberships: [{ workspace: "halvard", roles: ["designer"] }] },
];

export type DemoContext = {
  workspaces: Record<keyof typeof DEMO_WORKSPACES, { id: number; slug: string; name: string }>;
  /** user id by demo e-mail */
  users: Record<string, number>;
};

export type SeedStep = { name: string; run: (ctx: DemoContext) => Promise<void> };

/** Creates the workspaces, people and memberships; returns their ids. Assumes an empty database. */
export async function seedFoundation(): Promise<DemoContext> {
  const db = getDb();
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  const ws = {} as DemoContext["workspaces"];
  for (const [key, w] of Object.entries(DEMO_WORKSPACES) as [keyof typeof DEMO_WORKSPACES, { slug: string; name: string }][]) {
    const [row] = await db.insert(workspaces).values(w).returning({ id: workspaces.id });
    ws[key] = { id: row.id, ...w };
  }
  const userIds: Record<string, number> = {};
  for (const p of DEMO_PEOPLE) {
    const [u] = await db.insert(users).values({ email: p.email, name: p.name, passwordHash }).returning({ id: users.id });
    userIds[p.email] = u.id;
    for (const m of p.memberships) {
      const [mem] = await db.insert(memberships).values({ workspaceId: ws[m.workspace].id, userId: u.id }).returning({ id: memberships.id });
      await db.insert(membershipRoles).values(m.roles.map((role) => ({ membershipId: mem.id, role })));
      await insertAuditEvent(db, {
        workspaceId: ws[m.workspace].id,
        actorUserId: null,
        action: "member.seeded",
        objectType: "user",
        objectId: u.id,
        details: { roles: m.roles },
      });
    }
  }
  return { workspaces: ws, users: userIds };
}

/** Steps run after the foundation, in order. Later areas append theirs here. */
export const SEED_STEPS: SeedStep[] = [seedChipsStep, seedReviewStep];

/** True when the demo workspace already exists (seeding is then skipped). */
export async function isSeeded(): Promise<boolean> {
  const rows = await getDb().select({ id: workspaces.id }).from(workspaces).where(eq(workspaces.slug, DEMO_WORKSPACES.brookmere.slug)).limit(1);
  return rows.length > 0;
}

/** Seeds the demo data unless present; returns the context, or null when it was already seeded. */
export async function seedDemo(steps: SeedStep[] = SEED_STEPS): Promise<DemoContext | null> {
  if (await isSeeded()) return null;
  const ctx = await seedFoundation();
  for (const step of steps) await step.run(ctx);
  return ctx;
}

const isMain = process.argv[1] && path.resolve(process.argv[1]) === fileURLToPath(import.meta.url);
if (isMain) {
  const { migrateDatabase } = await import("./migrate");
  try {
    await migrateDatabase();
    const ctx = await seedDemo();
    console.log(ctx ? `Demo data created: ${Object.keys(ctx.users).length} people in 2 workspaces.` : "Demo data already present; nothing to do.");
  } catch (err) {
    console.error(`Seeding failed: ${err instanceof Error ? err.message : String(err)}`);
    process.exitCode = 1;
  } finally {
    closeDb();
  }
}
