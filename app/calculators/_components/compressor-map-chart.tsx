"use client";

import type { CheckedMapOutline, CompressorPointStatus } from "@/lib/calc";

export interface ChartPoint {
  rpm: number;
  flow: number;
  pressureRatio: number;
  status: CompressorPointStatus | "no-outline";
}

/** Words, colour and shape of each finding: never colour alone. */
export const POINT_LOOK: Record<ChartPoint["status"], { words: string; sign: string; className: string; fill: string }> = {
  inside: { words: "Inside the outline", sign: "●", className: "bg-pass-light text-pass", fill: "var(--c-pass)" },
  surge: { words: "Surge warning", sign: "▲", className: "bg-fail-light text-fail", fill: "var(--c-fail)" },
  choke: { words: "Choke warning", sign: "■", className: "bg-fail-light text-fail", fill: "var(--c-fail)" },
  "above-outline": { words: "Off the map (above)", sign: "◆", className: "bg-warn-light text-ink", fill: "var(--c-warn)" },
  "below-outline": { words: "Below the map (not checked)", sign: "◇", className: "bg-steel-100 text-ink", fill: "var(--c-warn)" },
  "no-outline": { words: "No map outline entered", sign: "○", className: "bg-steel-100 text-ink", fill: "#555" },
};

const W = 640;
const H = 380;
const PAD = { l: 64, r: 16, t: 16, b: 52 };

function marker(p: ChartPoint, x: number, y: number) {
  const fill = POINT_LOOK[p.status].fill;
  switch (p.status) {
    case "surge":
      return <polygon points={`${x},${y - 8} ${x - 7},${y + 6} ${x + 7},${y + 6}`} fill={fill} stroke="#000" />;
    case "choke":
      return <rect x={x - 6} y={y - 6} width={12} height={12} fill={fill} stroke="#000" />;
    case "above-outline":
    case "below-outline":
      return <polygon points={`${x},${y - 8} ${x + 8},${y} ${x},${y + 8} ${x - 8},${y}`} fill={fill} stroke="#000" />;
    default:
      return <circle cx={x} cy={y} r={6} fill={fill} stroke="#000" />;
  }
}

/** Operating points across the rev range over the user's map outline: corrected flow across, pressure ratio up. */
export function CompressorMapChart({
  outline,
  points,
  flowUnit,
}: {
  outline: CheckedMapOutline | null;
  points: ChartPoint[];
  flowUnit: string;
}) {
  const flows = [
    ...points.map((p) => p.flow),
    ...(outline ? [...outline.surgeLine, ...outline.chokeLine].map((p) => p.correctedFlow) : []),
  ];
  const prs = [
    ...points.map((p) => p.pressureRatio),
    ...(outline ? [...outline.surgeLine, ...outline.chokeLine].map((p) => p.pressureRatio) : []),
  ];
  const xMax = Math.max(1, ...flows) * 1.1;
  const yMin = 1;
  const yMax = Math.max(1.5, ...prs) * 1.05;
  const sx = (f: number) => PAD.l + (f / xMax) * (W - PAD.l - PAD.r);
  const sy = (pr: number) => H - PAD.b - ((pr - yMin) / (yMax - yMin)) * (H - PAD.t - PAD.b);
  const line = (pts: ReadonlyArray<{ correctedFlow: number; pressureRatio: number }>) =>
    pts.map((p) => `${sx(p.correctedFlow).toFixed(1)},${sy(p.pressureRatio).toFixed(1)}`).join(" ");
  const xTicks = Array.from({ length: 6 }, (_, i) => (xMax / 5) * i);
  const yTicks = Array.from({ length: 5 }, (_, i) => yMin + ((yMax - yMin) / 4) * i);
  return (
    <svg
      viewBox={`0 0 ${W} ${H}`}
      className="h-auto w-full max-w-3xl rounded-lg border-2 border-steel-300 bg-white"
      role="img"
      aria-label="Compressor operating points over the map outline"
      data-testid="compressor-map-chart"
    >
      {xTicks.map((t) => (
        <g key={`x${t}`}>
          <line x1={sx(t)} x2={sx(t)} y1={PAD.t} y2={H - PAD.b} stroke="#ddd" />
          <text x={sx(t)} y={H - PAD.b + 20} textAnchor="middle" fontSize="14">
            {t.toFixed(flowUnit === "kg/s" ? 2 : 0)}
          </text>
        </g>
      ))}
      {yTicks.map((t) => (
        <g key={`y${t}`}>
          <line x1={PAD.l} x2={W - PAD.r} y1={sy(t)} y2={sy(t)} stroke="#ddd" />
          <text x={PAD.l - 8} y={sy(t) + 5} textAnchor="end" fontSize="14">
            {t.toFixed(2)}
          </text>
        </g>
      ))}
      <text x={(W + PAD.l) / 2} y={H - 8} textAnchor="middle" fontSize="15" fontWeight="bold">
        Corrected air flow ({flowUnit})
      </text>
      <text x={16} y={(H - PAD.b) / 2} textAnchor="middle" fontSize="15" fontWeight="bold" transform={`rotate(-90 16 ${(H - PAD.b) / 2})`}>
        Pressure ratio
      </text>
      {outline && (
        <>
          <polyline
            points={line(outline.surgeLine)}
            fill="none"
            stroke="var(--c-fail)"
            strokeWidth={3}
            strokeDasharray="8 4"
            data-testid="surge-line"
          />
          <polyline points={line(outline.chokeLine)} fill="none" stroke="#333" strokeWidth={3} data-testid="choke-line" />
          <text
            x={sx(outline.surgeLine.at(-1)!.correctedFlow)}
            y={sy(outline.surgeLine.at(-1)!.pressureRatio) - 8}
            fontSize="14"
            textAnchor="middle"
          >
            surge line
          </text>
          <text
            x={sx(outline.chokeLine.at(-1)!.correctedFlow)}
            y={sy(outline.chokeLine.at(-1)!.pressureRatio) - 8}
            fontSize="14"
            textAnchor="middle"
          >
            choke line
          </text>
        </>
      )}
      <polyline
        points={points.map((p) => `${sx(p.flow).toFixed(1)},${sy(p.pressureRatio).toFixed(1)}`).join(" ")}
        fill="none"
        stroke="#1d4ed8"
        strokeWidth={2}
      />
      {points.map((p) => (
        <g key={p.rpm}>{marker(p, sx(p.flow), sy(p.pressureRatio))}</g>
      ))}
    </svg>
  );
}
