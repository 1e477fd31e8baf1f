import "server-only";
/**
 * The workspace-scoping rule, written once: every query over workspace-owned
 * rows takes a WorkspaceScope and filters by its workspaceId. A scope is only
 * minted by requireMembership (lib/auth/require.ts) after the membership has
 * been checked, or by trusted scripts (seed) through scopeForTrustedCode.
 */
import { eq, type SQL } from "drizzle-orm";
import type { SQLiteColumn } from "drizzle-orm/sqlite-core";
import type { Actor } from "@/lib/auth/permissions";

declare const scopeBrand: unique symbol;
export type WorkspaceScope = Actor & { readonly [scopeBrand]: true };

/** Mints a scope; call only after the actor's membership has been verified (or from seed/tests). */
export function scopeForTrustedCode(actor: Actor): WorkspaceScope {
  return Object.freeze({ ...actor, roles: [...actor.roles] }) as unknown as WorkspaceScope;
}

/** `table.workspaceId = scope.workspaceId` — add to every WHERE over workspace rows. */
export function inWorkspace(scope: WorkspaceScope, column: SQLiteColumn): SQL {
  return eq(column, scope.workspaceId);
}
