"use client";
/** A compact form bound to a server action (useActionState), with its message beside the buttons. */
import { useActionState, type ReactNode } from "react";
import type { ActionState } from "@/lib/http/action";

export function InlineActionForm({
  action,
  children,
  submitLabel,
  extraButtons,
  label,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  /** Fields; given the values echoed back after a refused attempt, so React's form reset keeps what was typed. */
  children: ReactNode | ((values: Record<string, string | string[]> | undefined) => ReactNode);
  submitLabel: string;
  extraButtons?: ReactNode;
  label: string;
}) {
  const [state, formAction, pending] = useActionState(action, { status: "idle" } as ActionState);
  return (
    <form action={formAction} className="space-y-2" aria-label={label} noValidate>
      {typeof children === "function" ? children(state.status === "error" ? state.values : undefined) : children}
      <div className="flex flex-wrap items-center gap-2">
        <button type="submit" className="btn-primary px-3 py-1.5" disabled={pending}>
          {pending ? "Saving…" : submitLabel}
        </button>
        {extraButtons}
        {state.status !== "idle" && state.message ? (
          <p role={state.status === "error" ? "alert" : "status"} className={`text-sm ${state.status === "error" ? "font-medium text-halt-800" : "text-stream-800"}`}>
            {state.message}
          </p>
        ) : null}
      </div>
    </form>
  );
}
