import { ROLE_LABELS, type Role } from "@/lib/auth/roles";

export function RoleBadge({ role }: { role: Role }) {
  return <span className="inline-block rounded-full border border-ink-200 bg-ink-100 px-2 py-0.5 text-xs font-medium text-ink-800">{ROLE_LABELS[role]}</span>;
}
