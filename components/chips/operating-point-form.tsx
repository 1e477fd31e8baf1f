"use client";
/**
 * The operating point form (react-hook-form + zodResolver(operatingPointFormSchema),
 * the same schema the server parses): fluid, temperature, each port of the
 * layout driven by pressure, flow or liquid head (or left open), an optional
 * second phase for droplet chips, solute, pump limit, process and cells.
 * Saving POSTs …/operating-points, which runs the analysis, and opens its result.
 */
import { zodResolver } from "@hookform/resolvers/zod";
import { useQueryClient } from "@tanstack/react-query";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm, type FieldPath } from "react-hook-form";
import { z } from "zod";
import { Notice } from "@/components/ui/notice";
import { operatingPointFormSchema } from "@/lib/chips/schemas";

type FormInput = z.input<typeof operatingPointFormSchema>;
type FormOutput = z.output<typeof operatingPointFormSchema>;

export interface Choice {
  value: string;
  label: string;
}

const DRIVE_WORDS = { pressure: "Pressure", flow: "Flow rate", head: "Liquid head", open: "Open (not driven)" } as const;
const DRIVE_PLACEHOLDER = { pressure: "e.g. 200 mbar", flow: "e.g. 10 uL/min", head: "e.g. 5 cm", open: "" } as const;

function ErrorText({ id, message }: { id: string; message?: string }) {
  if (!message) return null;
  return (
    <p id={id} className="mt-1 text-sm font-medium text-halt-800">
      {message}
    </p>
  );
}

export function OperatingPointForm({
  chipId,
  revisionNumber,
  analysisBaseHref,
  defaults,
  fluids,
  solutes,
  processes,
}: {
  chipId: number;
  revisionNumber: number;
  analysisBaseHref: string;
  defaults: FormInput;
  fluids: { library: Choice[]; workspace: Choice[] };
  solutes: Choice[];
  processes: Choice[];
}) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const [problem, setProblem] = useState<string | null>(null);
  const [twoPhase, setTwoPhase] = useState(Boolean(defaults.secondPhase));
  const form = useForm<FormInput, unknown, FormOutput>({ resolver: zodResolver(operatingPointFormSchema), defaultValues: defaults, mode: "onTouched" });
  const { fields } = useFieldArray({ control: form.control, name: "ports" });
  const errors = form.formState.errors;
  const drives = form.watch("ports");

  const onSubmit = form.handleSubmit(async (values) => {
    setProblem(null);
    const body = twoPhase ? values : { ...values, secondPhase: "", interfacialTension: "", ports: values.ports.map(({ phase: _phase, ...p }) => p) };
    try {
      const res = await fetch(`/api/v1/chips/${chipId}/revisions/${revisionNumber}/operating-points`, {
        method: "POST",
        headers: { "content-type": "application/json" },
        body: JSON.stringify(body),
      });
      const json = await res.json().catch(() => null);
      if (res.status === 201 && json?.analysis_id) {
        await queryClient.invalidateQueries({ queryKey: ["chips"] });
        router.push(`${analysisBaseHref}/${json.analysis_id}`);
        return;
      }
      const fieldErrors = (json?.error?.details?.fields ?? {}) as Record<string, string>;
      for (const [path, message] of Object.entries(fieldErrors)) form.setError(path as FieldPath<FormInput>, { message });
      setProblem(json?.error?.message ?? `Not saved (HTTP ${res.status}). Try again.`);
    } catch {
      setProblem("The form did not reach the server (network error). Try again.");
    }
  });

  const input = "field-input";
  const label = "mb-1 block text-sm font-medium text-ink-800";
  return (
    <form onSubmit={onSubmit} noValidate className="space-y-6" aria-label="New operating point" data-testid="operating-point-form">
      <div className="grid gap-4 md:grid-cols-3">
        <div>
          <label htmlFor="op-name" className={label}>
            Name
          </label>
          <input id="op-name" className={input} {...form.register("name")} aria-invalid={errors.name ? true : undefined} aria-describedby="op-name-error" />
          <ErrorText id="op-name-error" message={errors.name?.message} />
        </div>
        <div>
          <label htmlFor="op-fluid" className={label}>
            Fluid
          </label>
          <select id="op-fluid" className={input} {...form.register("fluid")} aria-describedby="op-fluid-error">
            <optgroup label="Stokeline library">
              {fluids.library.map((f) => (
                <option key={f.value} value={f.value}>
                  {f.label}
                </option>
              ))}
            </optgroup>
            {fluids.workspace.length > 0 ? (
              <optgroup label="This workspace’s fluids">
                {fluids.workspace.map((f) => (
                  <option key={f.value} value={f.value}>
                    {f.label}
                  </option>
                ))}
              </optgroup>
            ) : null}
          </select>
          <ErrorText id="op-fluid-error" message={errors.fluid?.message} />
        </div>
        <div>
          <label htmlFor="op-temperature" className={label}>
            Temperature
          </label>
          <input
            id="op-temperature"
            className={input}
            placeholder="25 degC"
            {...form.register("temperature")}
            aria-invalid={errors.temperature ? true : undefined}
            aria-describedby="op-temperature-error"
          />
          <ErrorText id="op-temperature-error" message={errors.temperature?.message} />
        </div>
      </div>

      <fieldset className="panel p-4">
        <legend className="px-1 text-sm font-semibold text-ink-900">Ports</legend>
        <p className="mb-3 text-sm text-ink-600">How each port of the layout is driven. Type a value with its unit; at least one port needs a pressure (an outlet at 0 mbar is usual).</p>
        <div className="mb-3">
          <label className="inline-flex items-center gap-2 text-sm text-ink-800">
            <input type="checkbox" checked={twoPhase} onChange={(e) => setTwoPhase(e.target.checked)} /> Droplet chip (two immiscible phases)
          </label>
        </div>
        <table className="w-full text-sm">
          <thead className="text-left text-xs uppercase tracking-wide text-ink-600">
            <tr>
              <th className="py-1 pr-3 font-semibold">Port</th>
              <th className="py-1 pr-3 font-semibold">Driven by</th>
              <th className="py-1 pr-3 font-semibold">Value</th>
              {twoPhase ? <th className="py-1 font-semibold">Phase fed</th> : null}
            </tr>
          </thead>
          <tbody>
            {fields.map((f, i) => {
              const drive = drives?.[i]?.drive ?? "pressure";
              const err = errors.ports?.[i]?.value?.message;
              return (
                <tr key={f.id} className="border-t border-ink-100 align-top" data-testid="port-row" data-port={f.name}>
                  <td className="py-2 pr-3 font-mono font-semibold text-ink-900">
                    {f.name}
                    <input type="hidden" {...form.register(`ports.${i}.name`)} />
                  </td>
                  <td className="py-2 pr-3">
                    <select aria-label={`How port ${f.name} is driven`} className={input} {...form.register(`ports.${i}.drive`)}>
                      {Object.entries(DRIVE_WORDS).map(([k, w]) => (
                        <option key={k} value={k}>
                          {w}
                        </option>
                      ))}
                    </select>
                  </td>
                  <td className="py-2 pr-3">
                    <input
                      aria-label={`Value at port ${f.name}`}
                      className={input}
                      disabled={drive === "open"}
                      placeholder={DRIVE_PLACEHOLDER[drive]}
                      {...form.register(`ports.${i}.value`)}
                      aria-invalid={err ? true : undefined}
                      aria-describedby={`port-${i}-error`}
                    />
                    <ErrorText id={`port-${i}-error`} message={err} />
                  </td>
                  {twoPhase ? (
                    <td className="py-2">
                      <select
                        aria-label={`Phase fed at port ${f.name}`}
                        className={input}
                        {...form.register(`ports.${i}.phase`, { setValueAs: (v) => (v === "" ? undefined : v) })}
                      >
                        <option value="">—</option>
                        <option value="continuous">Continuous (carrier)</option>
                        <option value="dispersed">Dispersed (droplets)</option>
                      </select>
                    </td>
                  ) : null}
                </tr>
              );
            })}
          </tbody>
        </table>
        {errors.ports?.message || errors.ports?.root?.message ? (
          <p className="mt-2 text-sm font-medium text-halt-800" role="alert">
            {errors.ports?.message ?? errors.ports?.root?.message}
          </p>
        ) : null}
      </fieldset>

      {twoPhase ? (
        <div className="grid gap-4 md:grid-cols-2">
          <div>
            <label htmlFor="op-second" className={label}>
              Dispersed phase
            </label>
            <select id="op-second" className={input} {...form.register("secondPhase")}>
              <option value="">Choose the droplet fluid</option>
              {[...fluids.library, ...fluids.workspace].map((f) => (
                <option key={f.value} value={f.value}>
                  {f.label}
                </option>
              ))}
            </select>
          </div>
          <div>
            <label htmlFor="op-ift" className={label}>
              Interfacial tension (optional)
            </label>
            <input id="op-ift" className={input} placeholder="e.g. 5 mN/m" {...form.register("interfacialTension")} aria-describedby="op-ift-error" />
            <ErrorText id="op-ift-error" message={errors.interfacialTension?.message} />
          </div>
        </div>
      ) : null}

      <div className="grid gap-4 md:grid-cols-3">
        <div>
          <label htmlFor="op-solute" className={label}>
            Solute (for mixing lengths)
          </label>
          <select id="op-solute" className={input} {...form.register("solute")}>
            <option value="">None</option>
            {solutes.map((s) => (
              <option key={s.value} value={s.value}>
                {s.label}
              </option>
            ))}
          </select>
        </div>
        <div>
          <label htmlFor="op-pump" className={label}>
            Pump limit (optional)
          </label>
          <input id="op-pump" className={input} placeholder="e.g. 2 bar" {...form.register("pumpMaxPressure")} aria-describedby="op-pump-error" />
          <ErrorText id="op-pump-error" message={errors.pumpMaxPressure?.message} />
        </div>
        <div>
          <label htmlFor="op-process" className={label}>
            Process
          </label>
          <select id="op-process" className={input} {...form.register("process")}>
            {processes.map((p) => (
              <option key={p.value} value={p.value}>
                {p.label}
              </option>
            ))}
          </select>
          <ErrorText id="op-process-error" message={errors.process?.message} />
        </div>
      </div>
      <label className="inline-flex items-center gap-2 text-sm text-ink-800">
        <input type="checkbox" {...form.register("cells")} /> Living cells flow through the chip (checks wall shear against cell-safe limits)
      </label>

      {problem ? (
        <div data-testid="operating-point-problem">
          <Notice tone="error" title="Not analysed">
            {problem}
          </Notice>
        </div>
      ) : null}
      {Object.keys(errors).length > 0 && !problem ? <p className="text-sm font-medium text-halt-800">Some fields need attention (marked above).</p> : null}
      <button type="submit" className="btn-primary" disabled={form.formState.isSubmitting}>
        {form.formState.isSubmitting ? "Analysing…" : "Save and analyse"}
      </button>
    </form>
  );
}
