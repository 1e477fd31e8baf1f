import type { BriefModel } from "@/lib/reports/brief";
import { BriefDrawing } from "./brief-drawing";

const FIGURE_TONE = { over: "text-halt-800", near: "text-heed-800", ok: "text-stream-700", none: "text-ink-900" } as const;
const FLAG_BORDER: Record<string, string> = { block: "border-halt-600", warn: "border-heed-600", info: "border-note-600", none: "border-stream-600" };

/**
 * The printable brief, from the same content model as the PDF (lib/reports/brief.ts).
 * Print CSS: A4, the page chrome hidden, the SHA-256 and generation time repeated on every printed page.
 */
export function BriefView({ brief }: { brief: BriefModel }) {
  const r = brief.revision;
  return (
    <article className="brief mx-auto max-w-4xl rounded-lg border border-ink-200 bg-white p-8 text-ink-900 print:rounded-none print:border-0 print:p-0" data-testid="brief">
      <style>{`
        @page { size: A4; margin: 16mm 14mm 20mm; }
        @media print {
          body { background: #fff !important; }
          header, nav, .no-print { display: none !important; }
          main { max-width: none !important; padding: 0 !important; }
          .brief { max-width: none !important; }
          .brief-footer { position: fixed; bottom: 0; left: 0; right: 0; font-size: 8px; }
          .brief-keep, .brief-flag, .brief-cautions { break-inside: avoid; }
          .brief h2 { break-after: avoid; }
          a { color: inherit; text-decoration: none; }
        }
      `}</style>
      <p className="text-xs font-medium uppercase tracking-wider text-ink-600">Stokeline brief · {brief.workspaceName}</p>
      <h1 className="mt-1 text-3xl font-semibold tracking-tight">{brief.title}</h1>
      <p className="text-lg text-ink-600">{brief.subtitle}</p>
      {brief.chip.purpose ? <p className="mt-2 max-w-prose">{brief.chip.purpose}</p> : null}
      <dl className="mt-4 grid grid-cols-[9rem_1fr] gap-x-4 gap-y-1 text-sm">
        <dt className="font-medium text-ink-600">File</dt>
        <dd>
          {r.fileName}, uploaded {r.uploadedAt} by {r.uploaderName}
        </dd>
        <dt className="font-medium text-ink-600">SHA-256</dt>
        <dd className="break-all font-mono text-xs leading-5" data-testid="brief-sha">
          {r.sha256}
        </dd>
        <dt className="font-medium text-ink-600">Review state</dt>
        <dd>
          {r.stateLabel} since {r.stateSince}
        </dd>
        <dt className="font-medium text-ink-600">Figures from</dt>
        <dd>
          {brief.analysis
            ? `Operating point “${brief.analysis.operatingPointName}” (analysis ${brief.analysis.id}, ${brief.analysis.createdAt}), ${brief.analysis.basis}`
            : "No successful analysis yet"}
        </dd>
        {r.note ? (
          <>
            <dt className="font-medium text-ink-600">Designer&apos;s note</dt>
            <dd>{r.note}</dd>
          </>
        ) : null}
      </dl>

      <section aria-labelledby="brief-figures" className="mt-8 brief-keep">
        <h2 id="brief-figures" className="border-b border-ink-200 pb-1 text-lg font-semibold">
          Key figures and their limits
        </h2>
        <table className="mt-2 w-full text-sm">
          <tbody>
            {brief.figures.map((f) => (
              <tr key={f.label} className="border-b border-ink-100 align-top" data-figure-status={f.status}>
                <th scope="row" className="w-1/4 py-1.5 pr-3 text-left font-medium">
                  {f.label}
                </th>
                <td className={`w-1/5 py-1.5 pr-3 font-semibold ${FIGURE_TONE[f.status]}`}>
                  {f.value}
                  {f.status === "over" ? <span className="block text-[0.7rem] font-medium uppercase tracking-wide">Over limit</span> : null}
                  {f.status === "near" ? <span className="block text-[0.7rem] font-medium uppercase tracking-wide">Near limit</span> : null}
                </td>
                <td className="py-1.5 text-ink-700">{[f.limit ? `Limit: ${f.limit}.` : "", f.note].filter(Boolean).join(" ")}</td>
              </tr>
            ))}
          </tbody>
        </table>
      </section>

      <section aria-labelledby="brief-cautions" className="brief-cautions mt-6 rounded-md border border-heed-600 border-l-4 bg-heed-100 px-5 py-4" data-testid="brief-cautions">
        <h2 id="brief-cautions" className="text-base font-semibold text-heed-800">
          Read before relying on these figures
        </h2>
        <ul className="mt-2 list-disc space-y-1 pl-5 text-sm text-ink-900">
          {brief.cautions.map((c) => (
            <li key={c}>{c}</li>
          ))}
        </ul>
      </section>

      {brief.drawing ? (
        <section aria-labelledby="brief-drawing" className="mt-8">
          <h2 id="brief-drawing" className="mb-2 border-b border-ink-200 pb-1 text-lg font-semibold">
            The chip, coloured by pressure
          </h2>
          <BriefDrawing drawing={brief.drawing} />
        </section>
      ) : null}

      <section aria-labelledby="brief-flags" className="mt-8">
        <h2 id="brief-flags" className="border-b border-ink-200 pb-1 text-lg font-semibold">
          Flags and their dispositions ({brief.flags.length})
        </h2>
        {brief.flags.length === 0 ? (
          <p className="mt-2 text-sm text-ink-600">{brief.analysis ? "The analysis raised no flags." : "No analysis, so no flags yet."}</p>
        ) : (
          <ul className="mt-3 space-y-3">
            {brief.flags.map((f, i) => (
              <li key={`${f.title}-${f.where}-${i}`} className={`brief-flag border-l-4 pl-3 ${FLAG_BORDER[f.severity] ?? "border-ink-300"}`}>
                <p className="text-sm font-semibold">
                  <span className="uppercase tracking-wide">{f.severityLabel}</span> · {f.title} — {f.where}
                  {f.value ? ` · ${f.value}` : ""}
                </p>
                {f.message ? <p className="text-sm text-ink-600">{f.message}</p> : null}
                <p className="text-sm font-medium">
                  {f.standingLabel}
                  {f.decidedBy ? ` — ${f.decidedBy}, ${f.decidedAt}` : ""}
                </p>
                {f.justification ? (
                  <p className="text-sm">
                    {f.standing === "waived" ? "Waiver justification" : "Reviewer's note"}: “{f.justification}”
                  </p>
                ) : null}
              </li>
            ))}
          </ul>
        )}
      </section>

      <section aria-labelledby="brief-clearance" className="mt-8 brief-keep">
        <h2 id="brief-clearance" className="border-b border-ink-200 pb-1 text-lg font-semibold">
          Clearance for tape-out
        </h2>
        {brief.clearance ? (
          <dl className="mt-2 grid grid-cols-[9rem_1fr] gap-x-4 gap-y-1 text-sm" data-testid="brief-clearance">
            <dt className="font-medium text-ink-600">Signed by</dt>
            <dd>{brief.clearance.by}</dd>
            <dt className="font-medium text-ink-600">When</dt>
            <dd>{brief.clearance.at}</dd>
            <dt className="font-medium text-ink-600">Fab</dt>
            <dd>{brief.clearance.fabName}</dd>
            <dt className="font-medium text-ink-600">Process</dt>
            <dd>{brief.clearance.process}</dd>
            <dt className="font-medium text-ink-600">SHA-256</dt>
            <dd className="break-all font-mono text-xs leading-5">{brief.clearance.fileSha256}</dd>
            <dt className="font-medium text-ink-600">Analysis</dt>
            <dd>{brief.clearance.analysisId}</dd>
            <dd className={`col-span-2 ${brief.clearance.matchesRevision ? "text-stream-700" : "font-semibold text-halt-800"}`}>
              {brief.clearance.matchesRevision ? "The signed SHA-256 matches this revision's file." : "Warning: the signed SHA-256 differs from this revision's file."}
            </dd>
          </dl>
        ) : (
          <p className="mt-2 text-sm text-ink-600">Not cleared for tape-out. The revision is {r.stateLabel.toLowerCase()}.</p>
        )}
      </section>

      <section aria-labelledby="brief-history" className="mt-8">
        <h2 id="brief-history" className="border-b border-ink-200 pb-1 text-lg font-semibold">
          Review history
        </h2>
        {brief.history.length === 0 ? (
          <p className="mt-2 text-sm text-ink-600">Nothing recorded yet.</p>
        ) : (
          <table className="mt-2 w-full text-sm">
            <tbody>
              {brief.history.map((e, i) => (
                <tr key={i} className="border-b border-ink-100 align-top">
                  <td className="w-40 whitespace-nowrap py-1 pr-3 font-mono text-xs text-ink-600">{e.at}</td>
                  <td className="w-36 py-1 pr-3 font-medium">{e.actor}</td>
                  <td className="py-1">{e.text}</td>
                </tr>
              ))}
            </tbody>
          </table>
        )}
      </section>

      <footer className="brief-footer mt-10 border-t border-ink-200 bg-white pt-2 text-xs text-ink-600" data-testid="brief-footer">
        <span className="break-all">{brief.footer}</span>
      </footer>
    </article>
  );
}
