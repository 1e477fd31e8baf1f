import Link from "next/link";
import { ReviewStateBadge } from "@/components/chips/review-state";
import { SeverityBadge } from "@/components/chips/severity-badge";
import { formatDuration, formatPressure, type PortfolioCard as Card } from "@/lib/reports/figures";
import { formatEngineering } from "@/lib/analysis/quantities";

/** Required pressure against one limit: a bar filled to the ratio (capped at 150 %), red above 100 %. */
function LimitBar({ label, limitPa, ratio }: { label: string; limitPa: number | null; ratio: number | null }) {
  if (limitPa === null || ratio === null) return <p className="text-xs text-ink-600">{label}: not set</p>;
  const over = ratio > 1;
  const near = !over && ratio > 0.8;
  const width = Math.min(ratio, 1.5) / 1.5;
  return (
    <div className="text-xs" data-limit={label.toLowerCase()} data-over={over ? "true" : "false"}>
      <div className="flex justify-between gap-2 text-ink-700">
        <span>
          {label} {formatPressure(limitPa)}
        </span>
        <span className={over ? "font-semibold text-halt-800" : near ? "font-semibold text-heed-800" : "text-ink-700"}>
          {Math.round(ratio * 100)} %{over ? " — over" : near ? " — near" : ""}
        </span>
      </div>
      <div className="relative mt-0.5 h-1.5 rounded bg-ink-100" aria-hidden="true">
        <div className={`absolute inset-y-0 left-0 rounded ${over ? "bg-halt-600" : near ? "bg-heed-600" : "bg-stream-600"}`} style={{ width: `${width * 100}%` }} />
        <div className="absolute inset-y-[-2px] w-px bg-ink-800" style={{ left: `${100 / 1.5}%` }} title="limit" />
      </div>
    </div>
  );
}

/** One chip on the lead's portfolio: where it stands, its headline figures and its worst open flag. */
export function PortfolioCard({ card, slug }: { card: Card; slug: string }) {
  const c = card.current;
  const a = card.analysis;
  return (
    <li className="panel flex flex-col gap-3 p-5" data-testid="portfolio-card" data-chip={card.name}>
      <div className="flex items-start justify-between gap-3">
        <div className="min-w-0 flex-1">
          <h2 className="text-lg font-semibold text-ink-900">
            <Link href={`/w/${slug}/chips/${card.chipId}`}>{card.name}</Link>
          </h2>
          <p className="text-sm text-ink-700">{card.purpose || "No purpose written down."}</p>
        </div>
        {card.cleared ? (
          <span className="shrink-0 rounded-full border border-stream-600 bg-stream-50 px-2.5 py-0.5 text-xs font-semibold text-stream-800" data-testid="cleared">
            Cleared for tape-out
          </span>
        ) : (
          <span className="shrink-0 rounded-full border border-ink-300 bg-ink-50 px-2.5 py-0.5 text-xs font-medium text-ink-700">Not cleared</span>
        )}
      </div>
      {c ? (
        <p className="flex flex-wrap items-center gap-2 text-sm text-ink-800">
          <span>
            Revision {c.number} of {card.revisionCount}
          </span>
          <ReviewStateBadge state={c.state} />
          <span className="text-ink-600">for {c.inStateFor}</span>
        </p>
      ) : (
        <p className="text-sm text-ink-600">No revision uploaded yet.</p>
      )}
      {a ? (
        <dl className="grid grid-cols-3 gap-3 border-t border-ink-100 pt-3 text-sm">
          <div className="col-span-3 sm:col-span-1">
            <dt className="text-xs text-ink-600">Required inlet pressure</dt>
            <dd className="font-semibold text-ink-900">{formatPressure(a.requiredPressurePa)}</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-600">Throughput</dt>
            <dd className="font-semibold text-ink-900">{a.throughputUlPerMin === null ? "—" : `${formatEngineering(Math.abs(a.throughputUlPerMin))} µL/min`}</dd>
          </div>
          <div>
            <dt className="text-xs text-ink-600">Residence time</dt>
            <dd className="font-semibold text-ink-900">{formatDuration(a.residenceS)}</dd>
          </div>
          <div className="col-span-3 grid gap-1.5 sm:grid-cols-2 sm:gap-4">
            <LimitBar label="Pump" limitPa={a.pumpMaxPa} ratio={a.pumpRatio} />
            <LimitBar label="Bond" limitPa={a.bondLimitPa} ratio={a.bondRatio} />
          </div>
          <p className="col-span-3 text-xs text-ink-600">At operating point “{a.operatingPointName}”.</p>
        </dl>
      ) : c ? (
        <p className="text-sm text-ink-600">Not analysed yet.</p>
      ) : null}
      {a ? (
        <div className="flex flex-wrap items-center gap-2 text-sm" data-testid="worst-open">
          <span className="text-xs text-ink-600">Worst open flag</span>
          {card.worstOpen ? (
            <>
              <SeverityBadge severity={card.worstOpen.severity} />
              <span className="text-ink-800">
                {card.worstOpen.title} — {card.worstOpen.where}
                {card.worstOpen.standing === "must_fix" ? " (marked must-fix)" : ""}
              </span>
            </>
          ) : (
            <SeverityBadge severity="none" />
          )}
          <span className="text-xs text-ink-600">
            {card.openCount} open{card.waivedCount > 0 ? `, ${card.waivedCount} waived` : ""}
          </span>
        </div>
      ) : null}
      <div className="mt-auto flex flex-wrap gap-2 border-t border-ink-100 pt-3">
        <Link className="btn-quiet" href={`/w/${slug}/chips/${card.chipId}/trends`}>
          Trends
        </Link>
        {c ? (
          <Link className="btn-quiet" href={`/w/${slug}/chips/${card.chipId}/revisions/${c.number}/brief`}>
            Brief
          </Link>
        ) : null}
      </div>
    </li>
  );
}
