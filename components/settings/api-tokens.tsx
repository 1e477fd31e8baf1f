"use client";
/**
 * Personal API tokens through the REST API with TanStack Query: list, create
 * (the secret is shown once, with a copy button), revoke; and a curl example.
 */
import { useMutation, useQuery, useQueryClient } from "@tanstack/react-query";
import { useState } from "react";
import { formatWhen } from "@/components/chips/format";
import { Notice } from "@/components/ui/notice";
import { apiTokenCreateSchema } from "@/lib/chips/schemas";

type TokenRow = { id: number; name: string; prefix: string; created_at: string; last_used_at: string | null; revoked_at: string | null };

async function json<T>(res: Response): Promise<T> {
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new Error(body?.error?.message ?? `HTTP ${res.status}`);
  return body as T;
}

export function ApiTokens({ workspaceId, origin, exampleChipId }: { workspaceId: number; origin: string; exampleChipId: number | null }) {
  const qc = useQueryClient();
  const key = ["tokens", workspaceId];
  const tokens = useQuery({
    queryKey: key,
    queryFn: async () => (await json<{ tokens: TokenRow[] }>(await fetch(`/api/v1/workspaces/${workspaceId}/tokens`))).tokens,
  });
  const [name, setName] = useState("");
  const [nameError, setNameError] = useState<string | null>(null);
  const [secret, setSecret] = useState<string | null>(null);
  const [copied, setCopied] = useState(false);
  const create = useMutation({
    mutationFn: async (tokenName: string) =>
      json<{ token: string }>(
        await fetch(`/api/v1/workspaces/${workspaceId}/tokens`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify({ name: tokenName }) }),
      ),
    onSuccess: (data) => {
      setSecret(data.token);
      setCopied(false);
      setName("");
      qc.invalidateQueries({ queryKey: key });
    },
  });
  const revoke = useMutation({
    mutationFn: async (id: number) => json(await fetch(`/api/v1/tokens/${id}`, { method: "DELETE" })),
    onSuccess: () => qc.invalidateQueries({ queryKey: key }),
  });
  const chip = exampleChipId ?? 1;
  const curl = `curl -H "Authorization: Bearer ${secret ?? "stk_…"}" \\
  -F "file=@layout.dxf" -F "note=Widened the outlet to 120 um" \\
  ${origin}/api/v1/chips/${chip}/revisions`;

  return (
    <div className="space-y-4">
      <form
        className="flex flex-wrap items-end gap-2"
        noValidate
        onSubmit={(e) => {
          e.preventDefault();
          const parsed = apiTokenCreateSchema.safeParse({ name });
          if (!parsed.success) {
            setNameError(parsed.error.issues[0]?.message ?? "Name the token.");
            return;
          }
          setNameError(null);
          create.mutate(parsed.data.name);
        }}
      >
        <div className="w-80">
          <label htmlFor="token-name" className="mb-1 block text-sm font-medium text-ink-800">
            Token name
          </label>
          <input
            id="token-name"
            className="field-input"
            value={name}
            placeholder="e.g. layout export script"
            onChange={(e) => setName(e.target.value)}
            aria-invalid={nameError ? true : undefined}
            aria-describedby={nameError ? "token-name-error" : undefined}
          />
        </div>
        <button type="submit" className="btn-primary" disabled={create.isPending}>
          {create.isPending ? "Creating…" : "Create token"}
        </button>
        {nameError ? (
          <p id="token-name-error" className="w-full text-sm font-medium text-halt-800">
            {nameError}
          </p>
        ) : null}
      </form>
      {create.isError ? <Notice tone="error">{create.error.message}</Notice> : null}
      {secret ? (
        <div data-testid="token-secret">
          <Notice tone="success" title="Copy this token now: it is shown only once">
            <div className="mt-1 flex flex-wrap items-center gap-2">
              <code className="break-all rounded bg-white px-2 py-1 font-mono text-ink-900">{secret}</code>
              <button
                type="button"
                className="btn-quiet px-3 py-1"
                onClick={async () => {
                  await navigator.clipboard?.writeText(secret).catch(() => undefined);
                  setCopied(true);
                }}
              >
                {copied ? "Copied" : "Copy"}
              </button>
            </div>
            <p className="mt-1">Stokeline stores only a hash of it. Keep it like a password; revoke it here if it leaks.</p>
          </Notice>
        </div>
      ) : null}
      {tokens.isPending ? (
        <p className="text-sm text-ink-500">Loading your tokens…</p>
      ) : tokens.isError ? (
        <Notice tone="error">Your tokens could not be loaded: {tokens.error.message}</Notice>
      ) : tokens.data.length === 0 ? (
        <p className="text-sm text-ink-600">You have no API tokens yet.</p>
      ) : (
        <table className="w-full text-left text-sm" data-testid="token-table">
          <thead className="text-xs uppercase tracking-wide text-ink-600">
            <tr>
              <th className="py-1 pr-3">Name</th>
              <th className="py-1 pr-3">Starts with</th>
              <th className="py-1 pr-3">Created</th>
              <th className="py-1 pr-3">Last used</th>
              <th className="py-1" />
            </tr>
          </thead>
          <tbody>
            {tokens.data.map((t) => (
              <tr key={t.id} className="border-t border-ink-100">
                <td className="py-2 pr-3 font-medium">{t.name}</td>
                <td className="py-2 pr-3 font-mono">{t.prefix}…</td>
                <td className="py-2 pr-3">{formatWhen(t.created_at)}</td>
                <td className="py-2 pr-3">{t.last_used_at ? formatWhen(t.last_used_at) : "Never"}</td>
                <td className="py-2 text-right">
                  {t.revoked_at ? (
                    <span className="text-ink-500">Revoked {formatWhen(t.revoked_at)}</span>
                  ) : (
                    <button type="button" className="btn-danger px-3 py-1" disabled={revoke.isPending} onClick={() => revoke.mutate(t.id)}>
                      Revoke
                    </button>
                  )}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
      {revoke.isError ? <Notice tone="error">{revoke.error.message}</Notice> : null}
      <div>
        <p className="text-sm font-medium text-ink-800">Upload a revision from a script</p>
        <pre className="mt-1 overflow-x-auto rounded-md bg-ink-900 p-3 font-mono text-xs text-ink-50">{curl}</pre>
        <p className="mt-1 text-xs text-ink-600">
          The answer is the new revision and its layer survey; the same file twice answers 409 with “already revision N”. The full API is described at{" "}
          <a href="/api/v1/openapi.json">/api/v1/openapi.json</a>.
        </p>
      </div>
    </div>
  );
}
