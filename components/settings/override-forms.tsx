"use client";
/** The fluidics reviewer's threshold form and the fab liaison's process-limit form. */
import { InlineActionForm } from "./inline-action-form";
import type { ActionState } from "@/lib/http/action";

type Action = (prev: ActionState, form: FormData) => Promise<ActionState>;

export function ThresholdForm({
  action,
  slug,
  ruleCode,
  title,
  unit,
  defaultThreshold,
  current,
}: {
  action: Action;
  slug: string;
  ruleCode: string;
  title: string;
  unit: string;
  defaultThreshold: number;
  current: { value: number; note: string } | null;
}) {
  return (
    <InlineActionForm
      action={action}
      submitLabel="Save"
      label={`Threshold for ${title}`}
      extraButtons={
        current ? (
          <button type="submit" name="reset" value="1" className="btn-quiet px-3 py-1.5">
            Reset
          </button>
        ) : null
      }
    >
      <>
          <input type="hidden" name="workspace" value={slug} />
          <input type="hidden" name="ruleCode" value={ruleCode} />
          {/* Keyed by the saved value: after a save or reset the inputs show what is stored; after a refusal they keep what was typed. */}
          <div className="flex gap-2" key={current ? `${current.value}|${current.note}` : "default"}>
            <input
              name="value"
              inputMode="decimal"
              aria-label={`Workspace threshold for ${title} (${unit})`}
              className="field-input w-24"
              defaultValue={current ? String(current.value) : ""}
              placeholder={String(defaultThreshold)}
            />
            <input name="note" aria-label={`Why, for ${title}`} className="field-input w-48" defaultValue={current?.note ?? ""} placeholder="Why" />
          </div>
      </>
    </InlineActionForm>
  );
}

export function ProcessLimitsForm({
  action,
  slug,
  processId,
  label,
  fields,
  note,
}: {
  action: Action;
  slug: string;
  processId: string;
  label: string;
  fields: { key: string; label: string; unit: string; current: string }[];
  note: string;
}) {
  return (
    <InlineActionForm action={action} submitLabel="Save limits" label={`Limits for ${label}`}>
      <>
          <input type="hidden" name="workspace" value={slug} />
          <input type="hidden" name="processKey" value={processId} />
          <div className="grid gap-3 md:grid-cols-4" key={fields.map((f) => f.current).join("|")}>
            {fields.map((f) => (
              <div key={f.key}>
                <label htmlFor={`${processId}-${f.key}`} className="mb-1 block text-xs font-medium text-ink-800">
                  {f.label}
                  {f.unit ? ` (${f.unit})` : ""}
                </label>
                <input id={`${processId}-${f.key}`} name={f.key} inputMode="decimal" className="field-input" defaultValue={f.current} placeholder="default" />
              </div>
            ))}
          </div>
          <div>
            <label htmlFor={`${processId}-note`} className="mb-1 block text-xs font-medium text-ink-800">
              Where your numbers come from
            </label>
            <input id={`${processId}-note`} name="note" className="field-input" defaultValue={note} placeholder="e.g. burst tests on our bonder, May 2026" />
          </div>
      </>
    </InlineActionForm>
  );
}
