"use client";

import { useState } from "react";
import { formatWhen } from "@/components/chips/format";

export type ShareLinkItem = {
  id: number;
  label: string;
  prefix: string;
  created_by: string | null;
  created_at: string;
  expires_at: string;
  revoked_at: string | null;
  status: "active" | "expired" | "revoked";
};

const STATUS_WORDS: Record<ShareLinkItem["status"], string> = { active: "Active", expired: "Expired", revoked: "Revoked" };

async function readError(res: Response): Promise<string> {
  try {
    const body = (await res.json()) as { error?: { message?: string } };
    return body.error?.message ?? `The server answered ${res.status}.`;
  } catch {
    return `The server answered ${res.status}.`;
  }
}

/**
 * Create and revoke read-only share links to this brief (leads and admins; the
 * server decides). A new link's address is shown once, right after creation.
 */
export function ShareLinksPanel({ revisionId, initial, maxDays, defaultDays }: { revisionId: number; initial: ShareLinkItem[]; maxDays: number; defaultDays: number }) {
  const [links, setLinks] = useState(initial);
  const [days, setDays] = useState(String(defaultDays));
  const [label, setLabel] = useState("");
  const [created, setCreated] = useState<string | null>(null);
  const [error, setError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  async function create(e: React.FormEvent) {
    e.preventDefault();
    setBusy(true);
    setError(null);
    setCreated(null);
    const res = await fetch(`/api/v1/revisions/${revisionId}/share-links`, {
      method: "POST",
      headers: { "content-type": "application/json" },
      body: JSON.stringify({ expiresInDays: Number(days), label: label.trim() || undefined }),
    });
    setBusy(false);
    if (!res.ok) return setError(await readError(res));
    const body = (await res.json()) as { share_link: ShareLinkItem; path: string };
    setCreated(`${window.location.origin}${body.path}`);
    setLinks((l) => [body.share_link, ...l]);
    setLabel("");
  }

  async function revoke(id: number) {
    setError(null);
    const res = await fetch(`/api/v1/share-links/${id}`, { method: "DELETE" });
    if (!res.ok) return setError(await readError(res));
    const body = (await res.json()) as { share_link: ShareLinkItem };
    setLinks((l) => l.map((x) => (x.id === id ? body.share_link : x)));
  }

  return (
    <section aria-labelledby="share-heading" className="panel no-print p-5" data-testid="share-links">
      <h2 id="share-heading" className="text-base font-semibold text-ink-900">
        Share this brief
      </h2>
      <p className="mt-1 max-w-prose text-sm text-ink-700">
        A share link opens this brief, read-only, for anyone who has it — nothing else of the workspace. It stops working when it expires or when you revoke it.
      </p>
      <form onSubmit={create} className="mt-3 flex flex-wrap items-end gap-3">
        <label className="text-sm">
          <span className="block font-medium text-ink-800">Valid for (days, 1–{maxDays})</span>
          <input
            type="number"
            min={1}
            max={maxDays}
            required
            value={days}
            onChange={(e) => setDays(e.target.value)}
            className="mt-1 w-28 rounded border border-ink-300 px-2 py-1.5"
            name="expiresInDays"
          />
        </label>
        <label className="text-sm">
          <span className="block font-medium text-ink-800">For whom (optional)</span>
          <input value={label} onChange={(e) => setLabel(e.target.value)} maxLength={120} className="mt-1 w-72 rounded border border-ink-300 px-2 py-1.5" name="label" placeholder="e.g. Board pack, December" />
        </label>
        <button type="submit" className="btn-primary" disabled={busy}>
          {busy ? "Creating…" : "Create share link"}
        </button>
      </form>
      {error ? (
        <p role="alert" className="mt-3 text-sm font-medium text-halt-800">
          {error}
        </p>
      ) : null}
      {created ? (
        <div role="status" className="mt-3 rounded border border-stream-600 bg-stream-50 p-3 text-sm">
          <p className="font-medium text-stream-800">Link created. Copy it now: it is shown only once.</p>
          <input readOnly value={created} onFocus={(e) => e.currentTarget.select()} className="mt-1 w-full rounded border border-ink-300 bg-white px-2 py-1 font-mono text-xs" data-testid="new-share-url" aria-label="New share link" />
        </div>
      ) : null}
      {links.length > 0 ? (
        <table className="mt-4 w-full text-sm">
          <thead>
            <tr className="border-b border-ink-200 text-left text-ink-600">
              <th className="py-1 pr-3 font-medium">Link</th>
              <th className="py-1 pr-3 font-medium">Created</th>
              <th className="py-1 pr-3 font-medium">Expires</th>
              <th className="py-1 pr-3 font-medium">Status</th>
              <th className="py-1" />
            </tr>
          </thead>
          <tbody>
            {links.map((l) => (
              <tr key={l.id} className="border-b border-ink-100" data-share-status={l.status}>
                <td className="py-1.5 pr-3">
                  <span className="font-mono text-xs">{l.prefix}…</span> {l.label ? <span className="text-ink-700">{l.label}</span> : null}
                </td>
                <td className="py-1.5 pr-3 text-ink-700">
                  {formatWhen(l.created_at)}
                  {l.created_by ? ` by ${l.created_by}` : ""}
                </td>
                <td className="py-1.5 pr-3 text-ink-700">{formatWhen(l.expires_at)}</td>
                <td className="py-1.5 pr-3">{STATUS_WORDS[l.status]}</td>
                <td className="py-1.5 text-right">
                  {l.status === "active" ? (
                    <button type="button" className="btn-quiet" onClick={() => revoke(l.id)} aria-label={`Revoke link ${l.prefix}`}>
                      Revoke
                    </button>
                  ) : null}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      ) : null}
    </section>
  );
}
