"use client";

import { forwardRef } from "react";
import { CartesianGrid, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";

export interface ChartSeries {
  key: string;
  name: string;
  colour: string;
  dashed: boolean;
  axis: "left" | "right";
  points: Array<{ rpm: number; value: number }>;
}

const tick = { fontSize: 15, fill: "#111418", fontFamily: "Arial, Helvetica, sans-serif" };

// Curves over engine speed; each series has its own points (runs need not share rpm values).
export const CurveChart = forwardRef<
  HTMLDivElement,
  { series: ChartSeries[]; leftLabel: string; rightLabel?: string; zeroLine?: boolean; height?: number; testId: string }
>(function CurveChart({ series, leftLabel, rightLabel, zeroLine, height = 420, testId }, ref) {
  const all = series.flatMap((s) => s.points.map((p) => p.rpm));
  const lo = Math.min(...all);
  const hi = Math.max(...all);
  return (
    <div ref={ref} data-testid={testId} className="w-full rounded-xl border-2 border-steel-300 bg-white p-2">
      <ResponsiveContainer width="100%" height={height}>
        <LineChart margin={{ top: 12, right: rightLabel ? 12 : 24, bottom: 28, left: 12 }}>
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
          {zeroLine && <ReferenceLine yAxisId="left" y={0} stroke="#111418" strokeWidth={2} />}
          <Tooltip formatter={(v) => (typeof v === "number" ? v.toFixed(1) : String(v))} labelFormatter={(l) => `${l} rpm`} />
          {series.map((s) => (
            <Line
              key={s.key}
              yAxisId={s.axis}
              data={s.points}
              dataKey="value"
              name={s.name}
              type="linear"
              stroke={s.colour}
              strokeWidth={3}
              strokeDasharray={s.dashed ? "8 5" : undefined}
              dot={false}
              isAnimationActive={false}
            />
          ))}
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
});
