"use client";
/**
 * The review steps the signed-in member may take now (the server's
 * allowedEvents), each as its own accessible form. The server checks again.
 */
import { useId } from "react";
import {
  clearAction,
  passFluidicsAction,
  requestChangesAction,
  submitAction,
  updateAnalysisAction,
  withdrawAction,
} from "@/app/(workspace)/w/[workspace]/chips/[chipId]/revisions/[number]/review/actions";
import { ActionForm } from "@/components/auth/action-form";
import type { ReviewEventType } from "@/lib/review/machine";
import type { ReviewWhere } from "./review-screen";

export type CandidateAnalysis = { id: number; name: string; createdAt: string; flagsBlock: number; flagsWarn: number };

function Hidden({ where, version }: { where: ReviewWhere; version: number }) {
  return (
    <>
      <input type="hidden" name="workspace" value={where.workspace} />
      <input type="hidden" name="revisionId" value={where.revisionId} />
      <input type="hidden" name="chipId" value={where.chipId} />
      <input type="hidden" name="number" value={where.number} />
      <input type="hidden" name="expectedVersion" value={version} />
    </>
  );
}

function TextArea({ name, label, hint, required, error }: { name: string; label: string; hint?: string; required?: boolean; error?: string }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        {label}
        {required ? <span className="text-halt-800"> *</span> : null}
      </label>
      <textarea id={id} name={name} rows={3} className="field-input text-sm" required={required} aria-invalid={error ? true : undefined} aria-describedby={hint ? `${id}-h` : undefined} />
      {hint ? (
        <p id={`${id}-h`} className="mt-1 text-xs text-ink-600">
          {hint}
        </p>
      ) : null}
    </div>
  );
}

function AnalysisSelect({ candidates, label, exclude }: { candidates: CandidateAnalysis[]; label: string; exclude?: number | null }) {
  const id = useId();
  const list = candidates.filter((c) => c.id !== exclude);
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        {label}
      </label>
      <select id={id} name="analysisId" className="field-input text-sm" defaultValue={list[0]?.id}>
        {list.map((c) => (
          <option key={c.id} value={c.id}>
            {c.name} (#{c.id}) · {c.flagsBlock} blocking · {c.flagsWarn} warnings
          </option>
        ))}
      </select>
    </div>
  );
}

function Step({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="rounded-md border border-ink-200 p-3" aria-label={title}>
      <h3 className="mb-2 text-sm font-semibold text-ink-900">{title}</h3>
      {children}
    </section>
  );
}

export function StepPanel({
  where,
  version,
  allowed,
  candidates,
  underReviewId,
  defaultProcess,
  cautions,
}: {
  where: ReviewWhere;
  version: number;
  allowed: ReviewEventType[];
  candidates: CandidateAnalysis[];
  underReviewId: number | null;
  defaultProcess: string;
  cautions: readonly string[];
}) {
  const can = (e: ReviewEventType) => allowed.includes(e);
  const steps = allowed.filter((e) => e !== "dispose_flag");
  return (
    <section aria-labelledby="steps-title" className="panel space-y-3 p-4" data-testid="review-steps">
      <h2 id="steps-title" className="text-base font-semibold text-ink-900">
        Your next step
      </h2>
      {steps.length === 0 ? <p className="text-sm text-ink-600">Nothing waits for you on this revision right now.</p> : null}

      {can("submit") ? (
        <Step title="Submit for review">
          {candidates.length === 0 ? (
            <p className="text-sm text-ink-700">Analyse an operating point of this revision first; review needs an analysed operating point.</p>
          ) : (
            <ActionForm action={submitAction} submitLabel="Submit for review" busyLabel="Submitting…" className="space-y-2" submitClassName="btn-primary">
              {(errors) => (
                <>
                  <Hidden where={where} version={version} />
                  <AnalysisSelect candidates={candidates} label="Operating point to review" />
                  <TextArea name="note" label="What changed and why" required error={errors.note} hint="The reviewers read this first." />
                </>
              )}
            </ActionForm>
          )}
        </Step>
      ) : null}

      {can("update_analysis") && candidates.some((c) => c.id !== underReviewId) ? (
        <Step title="Put a fixed analysis under review">
          <ActionForm action={updateAnalysisAction} submitLabel="Put under review" busyLabel="Updating…" className="space-y-2" submitClassName="btn-primary">
            {(errors) => (
              <>
                <Hidden where={where} version={version} />
                <AnalysisSelect candidates={candidates} label="Newer analysis" exclude={underReviewId} />
                <TextArea name="note" label="What you fixed" error={errors.note} />
              </>
            )}
          </ActionForm>
        </Step>
      ) : null}

      {can("pass_fluidics") ? (
        <Step title="Pass the fluidics review">
          <ActionForm action={passFluidicsAction} submitLabel="Pass fluidics review" busyLabel="Passing…" className="space-y-2" submitClassName="btn-primary">
            {(errors) => (
              <>
                <Hidden where={where} version={version} />
                <p className="text-xs text-ink-700">Every blocking flag must be fixed or waived with a justification, and no must-fix flag may still be raised.</p>
                <TextArea name="note" label="Note (optional)" error={errors.note} />
              </>
            )}
          </ActionForm>
        </Step>
      ) : null}

      {can("request_changes") ? (
        <Step title="Request changes">
          <ActionForm action={requestChangesAction} submitLabel="Request changes" busyLabel="Sending…" className="space-y-2" submitClassName="btn-quiet">
            {(errors) => (
              <>
                <Hidden where={where} version={version} />
                <TextArea name="note" label="What the designer should change" required error={errors.note} />
              </>
            )}
          </ActionForm>
        </Step>
      ) : null}

      {can("clear") ? (
        <Step title="Clear for tape-out">
          <div className="mb-2 rounded border-l-4 border-heed-600 bg-heed-100 px-3 py-2 text-xs text-heed-800">
            <p className="font-semibold">Before you sign</p>
            <ul className="mt-1 list-disc space-y-1 pl-4">
              {cautions.map((c) => (
                <li key={c}>{c}</li>
              ))}
            </ul>
          </div>
          <ActionForm action={clearAction} submitLabel="Clear and sign" busyLabel="Signing…" className="space-y-2" submitClassName="btn-primary">
            {(errors) => (
              <>
                <Hidden where={where} version={version} />
                <Field name="fabName" label="Fab" autoComplete="organization" error={errors.fabName} />
                <Field name="process" label="Process" defaultValue={defaultProcess} error={errors.process} />
                <Field name="password" label="Your password (signature)" type="password" autoComplete="current-password" error={errors.password} />
                <p className="text-xs text-ink-600">The record keeps who signed, when, the file&apos;s SHA-256 and the analysis it was based on. The revision is frozen afterwards.</p>
              </>
            )}
          </ActionForm>
        </Step>
      ) : null}

      {can("withdraw") ? (
        <details className="rounded-md border border-ink-200 p-3 text-sm">
          <summary className="cursor-pointer font-semibold text-halt-800">Withdraw this revision…</summary>
          <ActionForm action={withdrawAction} submitLabel="Withdraw revision" busyLabel="Withdrawing…" className="mt-2 space-y-2" submitClassName="btn-danger">
            {(errors) => (
              <>
                <Hidden where={where} version={version} />
                <TextArea name="reason" label="Reason (optional)" error={errors.reason} />
              </>
            )}
          </ActionForm>
        </details>
      ) : null}
    </section>
  );
}

function Field({ name, label, type = "text", autoComplete, defaultValue, error }: { name: string; label: string; type?: string; autoComplete?: string; defaultValue?: string; error?: string }) {
  const id = useId();
  return (
    <div>
      <label htmlFor={id} className="block text-sm font-medium text-ink-800">
        {label} <span className="text-halt-800">*</span>
      </label>
      <input id={id} name={name} type={type} autoComplete={autoComplete} defaultValue={defaultValue} required className="field-input text-sm" aria-invalid={error ? true : undefined} />
      {error ? <p className="mt-1 text-sm font-medium text-halt-800">{error}</p> : null}
    </div>
  );
}
