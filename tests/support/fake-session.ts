/**
 * Stand-in for lib/auth/session.ts in route-handler and action tests:
 *   vi.mock("@/lib/auth/session", () => import("@/tests/support/fake-session"));
 *   actAs(userId) / actAs(null)
 */
const holder = globalThis as unknown as { __stokelineTestUserId?: number | null };

export async function getSessionUserId(): Promise<number | null> {
  return holder.__stokelineTestUserId ?? null;
}

/** Makes the following calls run as this user (null = signed out). */
export function actAs(userId: number | null): void {
  holder.__stokelineTestUserId = userId;
}
