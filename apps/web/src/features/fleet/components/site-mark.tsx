import { siteColour, siteShape } from '../../../lib/palette';

/** A site's colour and shape as a small mark, the same one its line and points use on every chart. */
export function SiteMark({ slot, size = 12 }: { slot: number; size?: number }) {
  const fill = siteColour(slot);
  const shape = siteShape(slot);
  const h = size / 2;
  return (
    <svg width={size} height={size} viewBox={`0 0 ${size} ${size}`} aria-hidden="true" className="shrink-0">
      {shape === 'circle' ? <circle cx={h} cy={h} r={h - 0.5} fill={fill} /> : null}
      {shape === 'square' ? <rect x={0.5} y={0.5} width={size - 1} height={size - 1} fill={fill} /> : null}
      {shape === 'triangle' ? (
        <polygon points={`${h},0.5 ${size - 0.5},${size - 0.5} 0.5,${size - 0.5}`} fill={fill} />
      ) : null}
      {shape === 'diamond' ? <polygon points={`${h},0 ${size},${h} ${h},${size} 0,${h}`} fill={fill} /> : null}
    </svg>
  );
}
