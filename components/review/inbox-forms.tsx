"use client";
import { markReadAction, savePreferencesAction } from "@/app/(workspace)/w/[workspace]/inbox/actions";
import { ActionForm } from "@/components/auth/action-form";
import { NOTIFICATION_KINDS, NOTIFICATION_LABELS, type NotificationKind } from "@/lib/notifications/kinds";

export function MarkReadButton({ slug, id, label }: { slug: string; id?: number; label: string }) {
  return (
    <ActionForm action={markReadAction} submitLabel={label} busyLabel="Saving…" className="inline" submitClassName={id ? "text-xs font-semibold text-stream-700 underline" : "btn-quiet"}>
      {() => (
        <>
          <input type="hidden" name="workspace" value={slug} />
          {id ? <input type="hidden" name="id" value={id} /> : null}
        </>
      )}
    </ActionForm>
  );
}

export function EmailPreferencesForm({ slug, prefs }: { slug: string; prefs: Record<NotificationKind, boolean> }) {
  return (
    <ActionForm action={savePreferencesAction} submitLabel="Save e-mail settings" busyLabel="Saving…" className="space-y-4" submitClassName="btn-primary">
      {() => (
        <>
          <input type="hidden" name="workspace" value={slug} />
          <fieldset className="space-y-3">
            <legend className="mb-2 text-sm font-semibold text-ink-900">Send me an e-mail when…</legend>
            {NOTIFICATION_KINDS.map((k) => (
              <div key={k} className="flex items-start gap-2">
                <input id={`pref-${k}`} type="checkbox" name={k} defaultChecked={prefs[k]} className="mt-1" aria-describedby={`pref-${k}-h`} />
                <div>
                  <label htmlFor={`pref-${k}`} className="text-sm font-medium text-ink-900">
                    {NOTIFICATION_LABELS[k].title}
                  </label>
                  <p id={`pref-${k}-h`} className="text-xs text-ink-600">
                    {NOTIFICATION_LABELS[k].explain}
                  </p>
                </div>
              </div>
            ))}
          </fieldset>
        </>
      )}
    </ActionForm>
  );
}
