/** An SVG thumbnail of one layer's entities, drawn inside the whole drawing's frame so thumbnails line up. */
import type { LayerPreview, LayoutPreview } from "@/lib/chips/preview";

export function LayerThumbnail({ layer, frame, size = 132 }: { layer: LayerPreview; frame: LayoutPreview["bounds"]; size?: number }) {
  if (!frame || !layer.bounds) {
    return (
      <div className="flex items-center justify-center rounded border border-ink-200 bg-ink-50 text-xs text-ink-500" style={{ width: size, height: size }}>
        Nothing drawn
      </div>
    );
  }
  const w = Math.max(frame.maxX - frame.minX, 1e-9);
  const h = Math.max(frame.maxY - frame.minY, 1e-9);
  const pad = Math.max(w, h) * 0.04;
  const vb = `${frame.minX - pad} ${-(frame.maxY + pad)} ${w + 2 * pad} ${h + 2 * pad}`;
  const stroke = Math.max(w, h) / 90;
  return (
    <svg viewBox={vb} width={size} height={size} className="rounded border border-ink-200 bg-white" role="img" aria-label={`Preview of layer ${layer.name}`}>
      <g transform="scale(1,-1)" fill="none" stroke="#0c6a5c" strokeWidth={stroke} strokeLinecap="round" strokeLinejoin="round">
        {layer.paths.map((p, i) => {
          let d = "";
          for (let k = 0; k < p.length; k += 2) d += `${k === 0 ? "M" : "L"}${p[k]},${p[k + 1]}`;
          return <path key={i} d={d} />;
        })}
        {layer.circles.map(([cx, cy, r], i) => (
          <circle key={`c${i}`} cx={cx} cy={cy} r={Math.max(r, stroke)} stroke="#293d54" />
        ))}
      </g>
    </svg>
  );
}
