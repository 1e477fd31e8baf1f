"use client";
/**
 * Upload a layout: drag-and-drop or file picker, the size limit stated and
 * checked before sending, progress from XMLHttpRequest (fetch reports no upload
 * progress), "already revision N" with a link, then on to the layer mapping.
 */
import { useQuery, useQueryClient } from "@tanstack/react-query";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useRef, useState, type DragEvent } from "react";
import { Notice } from "@/components/ui/notice";
import { chipsQueryKey } from "./chip-table";
import { formatBytes, formatWhen, revisionHref } from "./format";

type Problem = { message: string; duplicateOf?: number };

export function revisionsQueryKey(chipId: number) {
  return ["revisions", chipId] as const;
}

type RevisionSummary = { number: number; file_name: string; uploaded_at: string; uploaded_by?: string | null };

async function fetchRevisions(chipId: number): Promise<RevisionSummary[]> {
  const res = await fetch(`/api/v1/chips/${chipId}/revisions`);
  const body = await res.json().catch(() => null);
  if (!res.ok) throw new Error(body?.error?.message ?? `Could not load the revisions (HTTP ${res.status}).`);
  return body.revisions;
}

/** Checks made in the browser before sending; the server checks the same again. */
export function checkFileBeforeUpload(file: { name: string; size: number }, maxBytes: number): string | null {
  if (!/\.dxf$/i.test(file.name)) return `“${file.name}” is not a .dxf file. Export the layout as an ASCII DXF and choose that file.`;
  if (file.size === 0) return `“${file.name}” is empty. Export the layout again.`;
  if (file.size > maxBytes) {
    return `“${file.name}” is ${formatBytes(file.size)}; uploads are limited to ${formatBytes(maxBytes)}. Purge unused blocks and layers and export again.`;
  }
  return null;
}

export function UploadForm({ slug, workspaceId, chipId, chipName, maxBytes }: { slug: string; workspaceId: number; chipId: number; chipName: string; maxBytes: number }) {
  const router = useRouter();
  const queryClient = useQueryClient();
  const input = useRef<HTMLInputElement>(null);
  const [file, setFile] = useState<File | null>(null);
  const [note, setNote] = useState("");
  const [dragging, setDragging] = useState(false);
  const [progress, setProgress] = useState<number | null>(null);
  const [problem, setProblem] = useState<Problem | null>(null);
  const [done, setDone] = useState<number | null>(null);
  const revisions = useQuery({ queryKey: revisionsQueryKey(chipId), queryFn: () => fetchRevisions(chipId) });

  const choose = (f: File | null | undefined) => {
    setDone(null);
    if (!f) return;
    const msg = checkFileBeforeUpload(f, maxBytes);
    setProblem(msg ? { message: msg } : null);
    setFile(msg ? null : f);
  };

  const onDrop = (e: DragEvent) => {
    e.preventDefault();
    setDragging(false);
    if (e.dataTransfer.files.length > 1) {
      setProblem({ message: "Drop one .dxf file at a time: each upload is one revision." });
      return;
    }
    choose(e.dataTransfer.files[0]);
  };

  const send = () => {
    if (!file) {
      setProblem({ message: "Choose the .dxf file of the new revision first." });
      return;
    }
    if (note.length > 2000) {
      setProblem({ message: "Keep the note under 2,000 characters." });
      return;
    }
    const data = new FormData();
    data.set("file", file);
    data.set("note", note);
    const xhr = new XMLHttpRequest();
    xhr.open("POST", `/api/v1/chips/${chipId}/revisions`);
    xhr.responseType = "json";
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable) setProgress(Math.round((e.loaded / e.total) * 100));
    };
    xhr.onerror = () => {
      setProgress(null);
      setProblem({ message: "The upload did not reach the server (network error). Check your connection and try again." });
    };
    xhr.onload = async () => {
      setProgress(null);
      const body = xhr.response as { revision?: { number: number }; error?: { code: string; message: string; details?: { revision?: number } } } | null;
      if (xhr.status === 201 && body?.revision) {
        setDone(body.revision.number);
        await Promise.all([
          queryClient.invalidateQueries({ queryKey: revisionsQueryKey(chipId) }),
          queryClient.invalidateQueries({ queryKey: chipsQueryKey(workspaceId) }),
        ]);
        router.push(`${revisionHref(slug, chipId, body.revision.number)}/layers`);
        return;
      }
      if (body?.error?.code === "duplicate_revision") {
        setProblem({ message: body.error.message, duplicateOf: body.error.details?.revision });
        return;
      }
      setProblem({ message: body?.error?.message ?? `The upload failed (HTTP ${xhr.status}). Try again.` });
    };
    setProblem(null);
    setProgress(0);
    xhr.send(data);
  };

  const busy = progress !== null;
  return (
    <div className="grid gap-6 lg:grid-cols-[2fr_1fr]">
      <div className="space-y-4">
        <p className="text-sm text-ink-700" data-testid="upload-limit">
          One ASCII <strong>.dxf</strong> file, at most <strong>{formatBytes(maxBytes)}</strong>. Every upload becomes a new, unchangeable revision of{" "}
          {chipName}; the same file twice is recognised by its SHA-256.
        </p>
        <div
          onDragOver={(e) => {
            e.preventDefault();
            setDragging(true);
          }}
          onDragLeave={() => setDragging(false)}
          onDrop={onDrop}
          className={`flex flex-col items-center justify-center gap-3 rounded-lg border-2 border-dashed px-6 py-10 text-center ${
            dragging ? "border-stream-600 bg-stream-50" : "border-ink-300 bg-white"
          }`}
          data-testid="drop-zone"
        >
          <svg viewBox="0 0 48 32" className="h-10 w-14" aria-hidden="true">
            <path d="M4 10h14c6 0 8 12 14 12h12" fill="none" className="stroke-stream-600" strokeWidth="3" strokeLinecap="round" />
            <path d="M4 22h14c6 0 8-12 14-12" fill="none" className="stroke-ink-400" strokeWidth="3" strokeLinecap="round" />
          </svg>
          <p className="text-ink-800">{file ? <span className="font-mono">{file.name}</span> : "Drag the layout here"}</p>
          {file ? <p className="text-sm text-ink-600">{formatBytes(file.size)}</p> : null}
          <label className="btn-quiet cursor-pointer">
            {file ? "Choose another file" : "Choose a .dxf file"}
            <input
              ref={input}
              type="file"
              accept=".dxf,application/dxf,image/vnd.dxf"
              className="sr-only"
              data-testid="file-input"
              onChange={(e) => choose(e.target.files?.[0])}
            />
          </label>
        </div>
        <div>
          <label htmlFor="revision-note" className="mb-1 block text-sm font-medium text-ink-800">
            What changed and why
          </label>
          <textarea
            id="revision-note"
            className="field-input min-h-24"
            value={note}
            maxLength={2000}
            onChange={(e) => setNote(e.target.value)}
            placeholder="e.g. Widened the oil inlets to 80 µm to bring the pressure below the pump limit."
          />
          <p className="mt-1 text-xs text-ink-600">Reviewers read this first. {2000 - note.length} characters left.</p>
        </div>
        {problem ? (
          <div data-testid="upload-problem">
            <Notice tone="error" title={problem.duplicateOf ? `Already revision ${problem.duplicateOf}` : "Not uploaded"}>
              <p>{problem.message}</p>
              {problem.duplicateOf ? (
                <p className="mt-1">
                  <Link href={revisionHref(slug, chipId, problem.duplicateOf)}>Open revision {problem.duplicateOf}</Link>
                </p>
              ) : null}
            </Notice>
          </div>
        ) : null}
        {busy ? (
          <div role="status" aria-live="polite">
            <p className="text-sm text-ink-700">Uploading… {progress}%</p>
            <progress className="mt-1 h-2 w-full accent-stream-600" max={100} value={progress ?? 0} aria-label="Upload progress" />
          </div>
        ) : null}
        {done !== null ? <Notice tone="success">Uploaded as revision {done}. Opening the layer mapping…</Notice> : null}
        <button type="button" className="btn-primary" onClick={send} disabled={busy || !file}>
          {busy ? "Uploading…" : "Upload revision"}
        </button>
      </div>
      <aside className="panel self-start p-4" aria-labelledby="recent-heading">
        <h2 id="recent-heading" className="text-sm font-semibold uppercase tracking-wide text-ink-600">
          Revisions so far
        </h2>
        {revisions.isPending ? (
          <p className="mt-2 text-sm text-ink-500">Loading…</p>
        ) : revisions.isError ? (
          <p className="mt-2 text-sm text-halt-800">{revisions.error.message}</p>
        ) : revisions.data.length === 0 ? (
          <p className="mt-2 text-sm text-ink-600">None yet: this will be revision 1.</p>
        ) : (
          <ul className="mt-2 space-y-2 text-sm" data-testid="recent-revisions">
            {revisions.data.map((r) => (
              <li key={r.number}>
                <Link href={revisionHref(slug, chipId, r.number)}>Revision {r.number}</Link>{" "}
                <span className="font-mono text-ink-700">{r.file_name}</span>
                <br />
                <span className="text-xs text-ink-500">
                  {r.uploaded_by ?? "—"} · {formatWhen(r.uploaded_at)}
                </span>
              </li>
            ))}
          </ul>
        )}
      </aside>
    </div>
  );
}
