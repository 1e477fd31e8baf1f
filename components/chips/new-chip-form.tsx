"use client";
/** "New chip" (designers): validated in the browser with chipCreateSchema, then by the same schema in the server action. */
import { zodResolver } from "@hookform/resolvers/zod";
import { useState, useTransition } from "react";
import { useForm } from "react-hook-form";
import { z } from "zod";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { chipCreateSchema } from "@/lib/chips/schemas";
import type { ActionState } from "@/lib/http/action";

type Input = z.input<typeof chipCreateSchema>;

export function NewChipForm({ slug, action }: { slug: string; action: (prev: ActionState, form: FormData) => Promise<ActionState> }) {
  const [open, setOpen] = useState(false);
  const [state, setState] = useState<ActionState>({ status: "idle" });
  const [pending, startTransition] = useTransition();
  const form = useForm<Input>({ resolver: zodResolver(chipCreateSchema), defaultValues: { name: "", purpose: "" } });
  if (!open) {
    return (
      <button type="button" className="btn-primary" onClick={() => setOpen(true)}>
        New chip
      </button>
    );
  }
  const submit = form.handleSubmit((values) => {
    const fd = new FormData();
    fd.set("workspace", slug);
    fd.set("name", values.name);
    fd.set("purpose", values.purpose ?? "");
    startTransition(async () => setState(await action(state, fd)));
  });
  const errors = { ...state.fieldErrors };
  return (
    <form onSubmit={submit} className="panel w-full max-w-xl space-y-3 p-5" noValidate aria-label="New chip">
      <h2 className="text-base font-semibold text-ink-900">New chip</h2>
      {state.status === "error" && state.message ? <Notice tone="error">{state.message}</Notice> : null}
      <Field label="Name" {...form.register("name")} error={form.formState.errors.name?.message ?? errors.name} hint="How the team calls it, e.g. “Droplet generator DG-2”." />
      <Field label="Purpose" {...form.register("purpose")} error={form.formState.errors.purpose?.message ?? errors.purpose} hint="One line: what the chip is for." />
      <div className="flex gap-2">
        <button type="submit" className="btn-primary" disabled={pending}>
          {pending ? "Creating…" : "Create chip"}
        </button>
        <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
          Cancel
        </button>
      </div>
    </form>
  );
}
