// The hot and cold pressure profiles of one mixing point: residual pressure against distance from the supply.
// Browser only (loaded lazily): the chart measures its container.
import { CartesianGrid, Legend, Line, LineChart, ReferenceLine, ResponsiveContainer, Tooltip, XAxis, YAxis } from "recharts";
import type { MixingPointResult } from "~/engineering";

export default function PressurePlot({ point }: { point: MixingPointResult }) {
  const toData = (profile: MixingPointResult["hotProfile"]) =>
    profile.map((p) => ({ distanceM: Number(p.distanceM.toFixed(2)), pressureKpa: Number(p.pressureKpa.toFixed(1)), node: p.nodeId + (p.note ? ` (${p.note})` : "") }));
  const lowest = Math.max(point.hotResidualKpa, point.coldResidualKpa) * (1 - point.limitPercent / 100);
  return (
    <div className="h-64 w-full" role="img" aria-label={`Pressure along the hot and cold paths to ${point.id}: hot ends at ${point.hotResidualKpa.toFixed(0)} kPa, cold at ${point.coldResidualKpa.toFixed(0)} kPa`}>
      <ResponsiveContainer width="100%" height="100%">
        <LineChart margin={{ top: 8, right: 16, bottom: 8, left: 0 }}>
          <CartesianGrid stroke="#d8cdb9" strokeDasharray="3 3" />
          <XAxis type="number" dataKey="distanceM" unit=" m" domain={[0, "dataMax"]} tick={{ fontSize: 12 }} />
          <YAxis type="number" dataKey="pressureKpa" unit=" kPa" width={72} tick={{ fontSize: 12 }} />
          <Tooltip formatter={(v) => [`${v} kPa`, "Pressure"]} labelFormatter={(d) => `${d} m from the supply`} />
          <Legend />
          <ReferenceLine y={lowest} stroke="#8a5a00" strokeDasharray="6 4" label={{ value: `limit ${point.limitPercent} %`, fontSize: 11, position: "insideBottomRight" }} />
          <Line data={toData(point.hotProfile)} name="Hot path" dataKey="pressureKpa" stroke="#a32020" strokeWidth={2} dot={{ r: 3 }} isAnimationActive={false} />
          <Line data={toData(point.coldProfile)} name="Cold path" dataKey="pressureKpa" stroke="#1f4e79" strokeWidth={2} strokeDasharray="5 3" dot={{ r: 3 }} isAnimationActive={false} />
        </LineChart>
      </ResponsiveContainer>
    </div>
  );
}
