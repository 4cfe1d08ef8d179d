/** A small to-scale drawing of a line's cross-section: victim, neighbours, barrier and the planes. */
export function CrossSection({
  widthM,
  thicknessM,
  spacingM,
  heightBelowM,
  heightAboveM,
  barrierM = 0,
  width = 260,
  height = 150,
}: {
  widthM: number;
  thicknessM: number;
  spacingM: number | null;
  heightBelowM: number;
  heightAboveM: number | null;
  barrierM?: number;
  width?: number;
  height?: number;
}) {
  const span = (spacingM !== null ? 3 * widthM + 2 * spacingM : widthM) * 1.3;
  const vspan = heightBelowM + thicknessM + (heightAboveM ?? thicknessM * 1.2);
  const scale = Math.min((width - 20) / span, (height - 30) / (vspan * 1.1));
  const cx = width / 2;
  const planeY = height - 14;
  const lineBottom = planeY - heightBelowM * scale;
  const lineTop = lineBottom - thicknessM * scale;
  const w = widthM * scale;
  const b = barrierM * scale;
  const lines = spacingM !== null ? [-1, 0, 1] : [0];
  const nm = (m: number) => `${Number((m * 1e9).toPrecision(3))} nm`;
  return (
    <svg
      width={width}
      height={height}
      role="img"
      aria-label={`Cross-section: width ${nm(widthM)}, thickness ${nm(thicknessM)}${spacingM !== null ? `, spacing ${nm(spacingM)}` : ""}, ILD below ${nm(heightBelowM)}${heightAboveM !== null ? `, above ${nm(heightAboveM)}` : ""}`}
    >
      <rect x={0} y={0} width={width} height={height} fill="#fbfaf8" />
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
      <text x={cx} y={height - 2} textAnchor="middle" fontSize={9} fill="#5f6368">
        W {nm(widthM)} · T {nm(thicknessM)}
        {spacingM !== null ? ` · S ${nm(spacingM)}` : ""} · H {nm(heightBelowM)}
      </text>
    </svg>
  );
}
