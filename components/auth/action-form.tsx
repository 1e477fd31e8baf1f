"use client";
import { useActionState, type ReactNode } from "react";
import { Notice } from "@/components/ui/notice";
import type { ActionState } from "@/lib/http/action";

type Props = {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  submitLabel: string;
  busyLabel?: string;
  /** Renders the fields, given the per-field errors and the (non-secret) values of the last failed attempt. */
  children: (fieldErrors: Record<string, string>, values: Record<string, string | string[]>) => ReactNode;
  className?: string;
  submitClassName?: string;
};

/** A form bound to a server action via useActionState, showing its message and field errors. */
export function ActionForm({ action, submitLabel, busyLabel, children, className = "space-y-4", submitClassName = "btn-primary w-full" }: Props) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as ActionState);
  return (
    <form action={formAction} className={className} noValidate>
      {state.message && state.status !== "idle" ? (
        <div data-testid={`form-${state.status}`}>
          <Notice tone={state.status === "ok" ? "success" : "error"}>{state.message}</Notice>
        </div>
      ) : null}
      {children(state.fieldErrors ?? {}, state.values ?? {})}
      <button type="submit" className={submitClassName} disabled={pending}>
        {pending ? (busyLabel ?? "Working…") : submitLabel}
      </button>
    </form>
  );
}
