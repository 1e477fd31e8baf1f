"use client";
/**
 * A compact form bound to a server action (useActionState), with its message
 * beside the buttons. Submitted by hand (not through the form's action prop)
 * so React does not reset the inputs: what was typed stays after a refusal.
 */
import { startTransition, useActionState, type FormEvent, type ReactNode } from "react";
import type { ActionState } from "@/lib/http/action";

export function InlineActionForm({
  action,
  children,
  submitLabel,
  extraButtons,
  label,
}: {
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  children: ReactNode;
  submitLabel: string;
  extraButtons?: ReactNode;
  label: string;
}) {
  const [state, dispatch, pending] = useActionState(action, { status: "idle" } as ActionState);
  const onSubmit = (e: FormEvent<HTMLFormElement>) => {
    e.preventDefault();
    const submitter = (e.nativeEvent as SubmitEvent).submitter as HTMLButtonElement | null;
    const data = new FormData(e.currentTarget, submitter);
    startTransition(() => dispatch(data));
  };
  return (
    <form onSubmit={onSubmit} className="space-y-2" aria-label={label} noValidate>
      {children}
      <div className="flex flex-wrap items-center gap-2">
        <button type="submit" className="btn-primary px-3 py-1.5" disabled={pending}>
          {pending ? "Saving…" : submitLabel}
        </button>
        {extraButtons}
        <p role={state.status === "error" ? "alert" : "status"} className={`text-sm ${state.status === "error" ? "font-medium text-halt-800" : "text-stream-800"}`}>
          {state.status !== "idle" ? state.message : null}
        </p>
      </div>
    </form>
  );
}
