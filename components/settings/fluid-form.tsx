"use client";
/** Add or edit a workspace fluid: react-hook-form with workspaceFluidSchema, then the same schema in saveFluidAction. */
import { zodResolver } from "@hookform/resolvers/zod";
import { useEffect, useState, useTransition } from "react";
import { useForm } from "react-hook-form";
import { Field } from "@/components/ui/field";
import { Notice } from "@/components/ui/notice";
import { workspaceFluidSchema, type WorkspaceFluidInput } from "@/lib/chips/schemas";
import type { ActionState } from "@/lib/http/action";

const EMPTY: WorkspaceFluidInput = { key: "", name: "", viscosity: "", viscositySource: "", density: "", densitySource: "", surfaceTension: "", surfaceTensionSource: "" };

export function FluidForm({
  slug,
  action,
  fluids,
}: {
  slug: string;
  action: (prev: ActionState, form: FormData) => Promise<ActionState>;
  fluids: WorkspaceFluidInput[];
}) {
  const [editing, setEditing] = useState<string>("");
  const [state, setState] = useState<ActionState>({ status: "idle" });
  const [pending, startTransition] = useTransition();
  const form = useForm<WorkspaceFluidInput>({ resolver: zodResolver(workspaceFluidSchema), defaultValues: EMPTY });
  useEffect(() => {
    form.reset(fluids.find((f) => f.key === editing) ?? EMPTY);
  }, [editing, fluids, form]);
  const submit = form.handleSubmit((values) => {
    const fd = new FormData();
    fd.set("workspace", slug);
    for (const [k, v] of Object.entries(values)) fd.set(k, String(v));
    startTransition(async () => {
      const next = await action(state, fd);
      setState(next);
      if (next.status === "ok" && !editing) form.reset(EMPTY);
    });
  });
  const e = form.formState.errors;
  const server = state.fieldErrors ?? {};
  const err = (k: keyof WorkspaceFluidInput) => e[k]?.message ?? server[k];
  return (
    <form onSubmit={submit} noValidate className="panel space-y-4 p-5" aria-label="Workspace fluid">
      <div className="flex flex-wrap items-end justify-between gap-3">
        <h3 className="text-base font-semibold text-ink-900">{editing ? `Edit “${fluids.find((f) => f.key === editing)?.name}”` : "Add a fluid"}</h3>
        {fluids.length > 0 ? (
          <div>
            <label htmlFor="fluid-edit" className="mb-1 block text-xs font-medium text-ink-700">
              Edit an existing fluid
            </label>
            <select id="fluid-edit" className="field-input" value={editing} onChange={(ev) => setEditing(ev.target.value)}>
              <option value="">— new fluid —</option>
              {fluids.map((f) => (
                <option key={f.key} value={f.key}>
                  {f.name}
                </option>
              ))}
            </select>
          </div>
        ) : null}
      </div>
      {state.status !== "idle" && state.message ? <Notice tone={state.status === "ok" ? "success" : "error"}>{state.message}</Notice> : null}
      <div className="grid gap-4 md:grid-cols-2">
        <Field label="Key" {...form.register("key")} readOnly={Boolean(editing)} error={err("key")} hint="Short id used in operating points, e.g. hfe_7500_2pct." />
        <Field label="Name" {...form.register("name")} error={err("name")} />
        <Field label="Viscosity" {...form.register("viscosity")} placeholder="e.g. 1.24 mPa*s" error={err("viscosity")} />
        <Field label="Source of the viscosity" {...form.register("viscositySource")} placeholder="Datasheet, measurement or handbook" error={err("viscositySource")} />
        <Field label="Density" {...form.register("density")} placeholder="e.g. 1614 kg/m^3" error={err("density")} />
        <Field label="Source of the density" {...form.register("densitySource")} error={err("densitySource")} />
        <Field label="Surface tension" {...form.register("surfaceTension")} placeholder="e.g. 16.2 mN/m" error={err("surfaceTension")} />
        <Field label="Source of the surface tension" {...form.register("surfaceTensionSource")} error={err("surfaceTensionSource")} />
      </div>
      <button type="submit" className="btn-primary" disabled={pending}>
        {pending ? "Saving…" : editing ? "Save changes" : "Add fluid"}
      </button>
    </form>
  );
}
