"use client";

import { forwardRef } from "react";
import { CartesianGrid, Line, LineChart, ReferenceDot, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface ChartSeries {
  key: string;
  name: string;
  colour: string;
  dashed: boolean;
  /** left: power; right: torque; channel: the logged channel on its own scale. */
  axis: "left" | "right" | "channel";
  points: Array<{ rpm: number; value: number }>;
}

/** A marked point (lean, over-boost) drawn on the left scale with its own shape. */
export interface ChartMark {
  key: string;
  rpm: number;
  value: number;
  kind: "lean" | "over-boost";
}

const tick = { fontSize: 15, fill: "#111418", fontFamily: "Arial, Helvetica, sans-serif" };
export const MARK_COLOURS = { lean: "#a3120f", "over-boost": "#8a4b00" } as const;

/** ▼ for lean, ■ for over-boost: the shape tells them apart without colour. */
function MarkShape({ cx, cy, kind }: { cx?: number; cy?: number; kind: ChartMark["kind"] }) {
  if (cx === undefined || cy === undefined) return null;
  const c = MARK_COLOURS[kind];
  return kind === "lean" ? (
    <path d={`M ${cx - 9} ${cy - 16} L ${cx + 9} ${cy - 16} L ${cx} ${cy - 2} Z`} fill={c} stroke="#ffffff" strokeWidth={1.5} />
  ) : (
    <rect x={cx - 7} y={cy + 3} width={14} height={14} fill={c} stroke="#ffffff" strokeWidth={1.5} />
  );
}

// Curves over engine speed; each series has its own points (runs need not share rpm values).
export const CurveChart = forwardRef<
  HTMLDivElement,
  {
    series: ChartSeries[];
    leftLabel: string;
    rightLabel?: string;
    channelLabel?: string;
    marks?: ChartMark[];
    zeroLine?: boolean;
    height?: number;
    testId: string;
  }
>(function CurveChart({ series, leftLabel, rightLabel, channelLabel, marks = [], zeroLine, height = 420, testId }, ref) {
  const all = series.flatMap((s) => s.points.map((p) => p.rpm));
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  return (
    <div ref={ref} data-testid={testId} className="w-full rounded-xl border-2 border-steel-300 bg-white p-2">
      <ResponsiveContainer width="100%" height={height}>
        <LineChart margin={{ top: 20, right: rightLabel ? 12 : 24, bottom: 28, left: 12 }}>
          <CartesianGrid stroke="#d0d6dc" />
          <XAxis
            type="number"
            dataKey="rpm"
            domain={[Math.floor(lo / 500) * 500, Math.ceil(hi / 500) * 500]}
            tickCount={8}
            tick={tick}
            allowDuplicatedCategory={false}
            label={{ value: "Engine speed (rpm)", position: "insideBottom", offset: -18, style: tick }}
          />
          <YAxis
            yAxisId="left"
            tick={tick}
            width={64}
            label={{ value: leftLabel, angle: -90, position: "insideLeft", style: { ...tick, textAnchor: "middle" } }}
          />
          {rightLabel && (
            <YAxis
              yAxisId="right"
              orientation="right"
              tick={tick}
              width={64}
              label={{ value: rightLabel, angle: 90, position: "insideRight", style: { ...tick, textAnchor: "middle" } }}
            />
          )}
          {channelLabel && (
            <YAxis
              yAxisId="channel"
              orientation="right"
              tick={tick}
              width={70}
              domain={["auto", "auto"]}
              label={{ value: channelLabel, angle: 90, position: "insideRight", style: { ...tick, textAnchor: "middle" } }}
            />
          )}
          {zeroLine && <ReferenceLine yAxisId="left" y={0} stroke="#111418" strokeWidth={2} />}
          <Tooltip formatter={(v) => (typeof v === "number" ? v.toFixed(2) : String(v))} labelFormatter={(l) => `${l} rpm`} />
          {series.map((s) => (
            <Line
              key={s.key}
              yAxisId={s.axis}
              data={s.points}
              dataKey="value"
              name={s.name}
              type="linear"
              stroke={s.colour}
              strokeWidth={s.axis === "channel" ? 2 : 3}
              strokeDasharray={s.axis === "channel" ? "2 4" : s.dashed ? "8 5" : undefined}
              dot={false}
              isAnimationActive={false}
            />
          ))}
          {marks.map((m) => (
            <ReferenceDot
              key={m.key}
              yAxisId="left"
              x={m.rpm}
              y={m.value}
              r={8}
              ifOverflow="extendDomain"
              shape={(props: { cx?: number; cy?: number }) => <MarkShape cx={props.cx} cy={props.cy} kind={m.kind} />}
            />
          ))}
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
});
