/** The five roles a workspace member can hold (several at once). Pure: no imports. */
export const ROLES = ["admin", "designer", "fluidics_reviewer", "fab_liaison", "lead"] as const;
export type Role = (typeof ROLES)[number];

export const ROLE_LABELS: Record<Role, string> = {
  admin: "Admin",
  designer: "Device designer",
  fluidics_reviewer: "Fluidics reviewer",
  fab_liaison: "Fab liaison",
  lead: "Lead",
};

export function isRole(value: unknown): value is Role {
  return typeof value === "string" && (ROLES as readonly string[]).includes(value);
}
