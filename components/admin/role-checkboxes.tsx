import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";

/** A labelled group of role checkboxes (a fieldset with a legend), posting roles[]. */
export function RoleCheckboxes({ idPrefix, selected = [], legend = "Roles", error }: { idPrefix: string; selected?: Role[]; legend?: string; error?: string }) {
  return (
    <fieldset aria-describedby={error ? `${idPrefix}-roles-error` : undefined}>
      <legend className="mb-1 text-sm font-medium text-ink-800">{legend}</legend>
      <div className="flex flex-wrap gap-x-4 gap-y-1">
        {ROLES.map((role) => (
          <label key={role} className="inline-flex items-center gap-1.5 text-sm text-ink-800" htmlFor={`${idPrefix}-${role}`}>
            <input id={`${idPrefix}-${role}`} type="checkbox" name="roles[]" value={role} defaultChecked={selected.includes(role)} className="h-4 w-4 accent-stream-700" />
            {ROLE_LABELS[role]}
          </label>
        ))}
      </div>
      {error ? (
        <p id={`${idPrefix}-roles-error`} className="mt-1 text-sm font-medium text-halt-800">
          {error}
        </p>
      ) : null}
    </fieldset>
  );
}
