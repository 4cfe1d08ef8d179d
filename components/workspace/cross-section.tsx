import type { AirGap } from "@/lib/scaling";

// Dielectric regions: the ILD, and the gap layer between the lines (an air gap), in two tints the legend names.
const ILD_FILL = "#e8eef3";
const GAP_FILL = "#fdfdfb";
const GAP_EDGE = "#9fb3c4";

/**
 * A small to-scale drawing of a line's cross-section: victim, neighbours, barrier, the planes and the dielectric
 * regions (the ILD of permittivity k; with an air gap, the layer of k_gap between the lines from their bottom up to
 * gapFraction × T, dashed).
 */
export function CrossSection({
  widthM,
  thicknessM,
  spacingM,
  heightBelowM,
  heightAboveM,
  barrierM = 0,
  k,
  airGap = null,
  width = 260,
  height = 150,
  scale: scaleProp,
  label,
}: {
  widthM: number;
  thicknessM: number;
  spacingM: number | null;
  heightBelowM: number;
  heightAboveM: number | null;
  barrierM?: number;
  /** The ILD's k, labelled in the drawing when given. */
  k?: number;
  airGap?: AirGap | null;
  width?: number;
  height?: number;
  /** Pixels per metre: several drawings at one scale (the stack view); absent = fitted to width × height. */
  scale?: number;
  /** Names the drawing in its accessible label (e.g. the class). */
  label?: string;
}) {
  const span = (spacingM !== null ? 3 * widthM + 2 * spacingM : widthM) * 1.3;
  const vspan = heightBelowM + thicknessM + (heightAboveM ?? thicknessM * 1.2);
  const scale = scaleProp ?? Math.min((width - 20) / span, (height - 30) / (vspan * 1.1));
  const cx = width / 2;
  const planeY = height - 14;
  const lineBottom = planeY - heightBelowM * scale;
  const lineTop = lineBottom - thicknessM * scale;
  const w = widthM * scale;
  const b = barrierM * scale;
  const lines = spacingM !== null ? [-1, 0, 1] : [0];
  const nm = (m: number) => `${Number((m * 1e9).toPrecision(3))} nm`;
  const num = (v: number) => `${Number(v.toPrecision(3))}`;
  const topY = heightAboveM !== null ? lineTop - heightAboveM * scale : 4;
  const gapTop = airGap ? lineBottom - airGap.gapFraction * (lineBottom - lineTop) : lineBottom;
  return (
    <svg
      width={width}
      height={height}
      role="img"
      aria-label={`Cross-section${label ? ` of ${label}` : ""}: width ${nm(widthM)}, thickness ${nm(thicknessM)}${spacingM !== null ? `, spacing ${nm(spacingM)}` : ""}, ILD below ${nm(heightBelowM)}${heightAboveM !== null ? `, above ${nm(heightAboveM)}` : ""}${k !== undefined ? `, ILD k ${num(k)}` : ""}${airGap ? `, gap k ${num(airGap.kGap)} between the lines up to ${num(100 * airGap.gapFraction)}% of the thickness` : ""}`}
      data-testid="cross-section"
    >
      <rect x={0} y={0} width={width} height={height} fill="#fbfaf8" />
      <rect x={4} y={topY} width={width - 8} height={planeY - topY} fill={ILD_FILL} data-region="ild" />
      {airGap && gapTop < lineBottom ? (
        <rect
          x={4}
          y={gapTop}
          width={width - 8}
          height={lineBottom - gapTop}
          fill={GAP_FILL}
          stroke={GAP_EDGE}
          strokeDasharray="3 2"
          strokeWidth={0.8}
          data-region="gap"
        />
      ) : null}
      <rect x={4} y={planeY} width={width - 8} height={4} fill="#8a8f96" />
      {heightAboveM !== null ? <rect x={4} y={lineTop - heightAboveM * scale - 4} width={width - 8} height={4} fill="#8a8f96" /> : null}
      {lines.map((i) => {
        const x = cx - w / 2 + i * (w + (spacingM ?? 0) * scale);
        return (
          <g key={i}>
            <rect x={x} y={lineTop} width={w} height={lineBottom - lineTop} fill={i === 0 ? "#b4622d" : "#d9b79c"} />
            {b > 0.6 ? (
              <rect
                x={x + b}
                y={lineTop}
                width={Math.max(0, w - 2 * b)}
                height={Math.max(0, lineBottom - lineTop - b)}
                fill={i === 0 ? "#c9773f" : "#e6cbb6"}
              />
            ) : null}
          </g>
        );
      })}
      {k !== undefined ? (
        <text x={8} y={planeY - 3} fontSize={9} fill="#4b5b6a">
          ILD k {num(k)}
        </text>
      ) : null}
      {airGap && gapTop < lineBottom ? (
        <text x={width - 8} y={Math.max(gapTop - 2, 10)} textAnchor="end" fontSize={9} fill="#4b5b6a">
          gap k {num(airGap.kGap)}
        </text>
      ) : null}
      <text x={cx} y={height - 2} textAnchor="middle" fontSize={9} fill="#5f6368">
        W {nm(widthM)} · T {nm(thicknessM)}
        {spacingM !== null ? ` · S ${nm(spacingM)}` : ""} · H {nm(heightBelowM)}
      </text>
    </svg>
  );
}
