import type { BriefDrawing as Drawing } from "@/lib/reports/brief";

/** The brief's chip drawing as SVG, from the same primitives the PDF draws. */
export function BriefDrawing({ drawing }: { drawing: Drawing }) {
  const { box } = drawing;
  const unit = Math.max(box.width, box.height) / 600; // one screen pixel at ~600 px across
  const gradientId = "brief-pressure-ramp";
  return (
    <figure className="brief-keep">
      <svg
        viewBox={`${box.minX} ${box.minY} ${box.width} ${box.height}`}
        className="h-auto max-h-[420px] w-full rounded border border-ink-200 bg-white"
        role="img"
        aria-label="The chip's channels coloured by mean pressure"
        data-testid="brief-drawing"
      >
        {drawing.outline.map((ring, i) => (
          <polyline key={`o${i}`} points={ring.map((p) => p.join(",")).join(" ")} fill="none" stroke="#8592a3" strokeWidth={unit} />
        ))}
        {drawing.segments.map((s) => (
          <polyline
            key={s.id}
            points={s.points.map((p) => p.join(",")).join(" ")}
            fill="none"
            stroke={s.colour}
            strokeWidth={Math.max(s.widthUm, unit * 1.2)}
            strokeLinecap="round"
            strokeLinejoin="round"
          >
            <title>{`Segment ${s.id}`}</title>
          </polyline>
        ))}
        {drawing.ports.map((p) => (
          <g key={p.name}>
            <circle cx={p.x} cy={p.y} r={Math.max(p.radiusUm, unit * 4)} fill="none" stroke="#1b2430" strokeWidth={unit * 1.3} />
            <text x={p.x + Math.max(p.radiusUm, unit * 4) + unit * 3} y={p.y + unit * 4} fontSize={unit * 12} fill="#1b2430">
              {p.name}
            </text>
          </g>
        ))}
      </svg>
      <figcaption className="mt-2 text-sm text-ink-700">
        <p className="font-medium">{drawing.legend.title}</p>
        {drawing.legend.noData ? null : (
          <svg viewBox="0 0 300 34" className="mt-1 w-full max-w-sm" aria-hidden="true">
            <defs>
              <linearGradient id={gradientId} x1="0" x2="1" y1="0" y2="0">
                {drawing.legend.stops.map((s) => (
                  <stop key={s.offset} offset={s.offset} stopColor={s.colour} />
                ))}
              </linearGradient>
            </defs>
            <rect x="10" y="2" width="280" height="11" fill={`url(#${gradientId})`} stroke="#55606e" strokeWidth="0.5" />
            {drawing.legend.ticks.map((t) => (
              <g key={t.offset} transform={`translate(${10 + t.offset * 280},0)`}>
                <line y1="13" y2="17" stroke="#1b2430" strokeWidth="0.7" />
                <text y="28" textAnchor="middle" fontSize="9" fill="#1b2430">
                  {t.label}
                </text>
              </g>
            ))}
          </svg>
        )}
        <p className="text-xs text-ink-600">Viridis colour scale (lightness rises with pressure; reads in greyscale). Channels drawn at their mean width; circles are ports.</p>
      </figcaption>
    </figure>
  );
}
