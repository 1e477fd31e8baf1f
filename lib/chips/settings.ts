import "server-only";
/**
 * Workspace settings that feed analyses: the workspace's own fluids, its
 * overrides of flag thresholds and of process-profile limits. Every change is
 * audited; every read is scoped.
 */
import { and, asc, eq } from "drizzle-orm";
import { getDb } from "@/db";
import { inWorkspace, type WorkspaceScope } from "@/db/queries/scope";
import { processOverrides, thresholdOverrides, workspaceFluids } from "@/db/schema-chips";
import { recordAuditEvent } from "@/lib/audit";
import type { MemberContext } from "@/lib/auth/require";
import type { WorkspaceFluidChoice } from "./conditions";
import type { WorkspaceFluidInput } from "./schemas";

export type WorkspaceFluidView = WorkspaceFluidChoice & { sources: { viscosity: string; density: string; surfaceTension: string }; updatedAt: Date };

export async function listWorkspaceFluids(scope: WorkspaceScope): Promise<WorkspaceFluidView[]> {
  const rows = await getDb().select().from(workspaceFluids).where(inWorkspace(scope, workspaceFluids.workspaceId)).orderBy(asc(workspaceFluids.name));
  return rows.map((r) => {
    const p = r.properties as Record<string, string>;
    return {
      key: r.key,
      name: r.name,
      viscosity: p.viscosity,
      density: p.density,
      surfaceTension: p.surfaceTension,
      sources: { viscosity: p.viscositySource, density: p.densitySource, surfaceTension: p.surfaceTensionSource },
      updatedAt: r.updatedAt,
    };
  });
}

export async function listWorkspaceFluidChoices(scope: WorkspaceScope): Promise<WorkspaceFluidChoice[]> {
  return (await listWorkspaceFluids(scope)).map(({ key, name, viscosity, density, surfaceTension }) => ({ key, name, viscosity, density, surfaceTension }));
}

/** Adds or replaces a workspace fluid by key. Existing analyses keep the values they were run with. */
export async function saveWorkspaceFluid(ctx: MemberContext, input: WorkspaceFluidInput): Promise<void> {
  const { key, name, ...properties } = input;
  await getDb().transaction(async (tx) => {
    await tx
      .insert(workspaceFluids)
      .values({ workspaceId: ctx.workspace.id, key, name, properties, updatedByUserId: ctx.user.id })
      .onConflictDoUpdate({
        target: [workspaceFluids.workspaceId, workspaceFluids.key],
        set: { name, properties, updatedByUserId: ctx.user.id, updatedAt: new Date() },
      });
    await recordAuditEvent(
      { workspaceId: ctx.workspace.id, actorUserId: ctx.user.id, action: "settings.fluid_saved", objectType: "workspace_fluid", objectId: key, details: { name, ...properties } },
      tx,
    );
  });
}

export async function listThresholdOverrides(scope: WorkspaceScope): Promise<Record<string, { value: number; note: string; updatedAt: Date }>> {
  const rows = await getDb().select().from(thresholdOverrides).where(inWorkspace(scope, thresholdOverrides.workspaceId));
  return Object.fromEntries(rows.map((r) => [r.ruleCode, { value: r.value, note: r.note, updatedAt: r.updatedAt }]));
}

export async function saveThresholdOverride(ctx: MemberContext, ruleCode: string, value: number | null, note: string): Promise<void> {
  await getDb().transaction(async (tx) => {
    if (value === null) {
      await tx.delete(thresholdOverrides).where(and(inWorkspace(ctx.scope, thresholdOverrides.workspaceId), eq(thresholdOverrides.ruleCode, ruleCode)));
    } else {
      await tx
        .insert(thresholdOverrides)
        .values({ workspaceId: ctx.workspace.id, ruleCode, value, note, updatedByUserId: ctx.user.id })
        .onConflictDoUpdate({ target: [thresholdOverrides.workspaceId, thresholdOverrides.ruleCode], set: { value, note, updatedByUserId: ctx.user.id, updatedAt: new Date() } });
    }
    await recordAuditEvent(
      { workspaceId: ctx.workspace.id, actorUserId: ctx.user.id, action: value === null ? "settings.threshold_reset" : "settings.threshold_saved", objectType: "rule", objectId: ruleCode, details: { value, note } },
      tx,
    );
  });
}

export async function listProcessOverrides(scope: WorkspaceScope): Promise<Record<string, { values: Record<string, number>; note: string; updatedAt: Date }>> {
  const rows = await getDb().select().from(processOverrides).where(inWorkspace(scope, processOverrides.workspaceId));
  return Object.fromEntries(rows.map((r) => [r.processKey, { values: r.values, note: r.note, updatedAt: r.updatedAt }]));
}

export async function saveProcessOverride(ctx: MemberContext, processKey: string, values: Record<string, number>, note: string): Promise<void> {
  await getDb().transaction(async (tx) => {
    await tx
      .insert(processOverrides)
      .values({ workspaceId: ctx.workspace.id, processKey, values, note, updatedByUserId: ctx.user.id })
      .onConflictDoUpdate({ target: [processOverrides.workspaceId, processOverrides.processKey], set: { values, note, updatedByUserId: ctx.user.id, updatedAt: new Date() } });
    await recordAuditEvent(
      { workspaceId: ctx.workspace.id, actorUserId: ctx.user.id, action: "settings.process_saved", objectType: "process", objectId: processKey, details: { values, note } },
      tx,
    );
  });
}
