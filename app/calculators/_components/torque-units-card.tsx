"use client";

import { useState } from "react";
import { convertTorque, TORQUE_UNITS, type TorqueUnit } from "@/lib/calc";
import { NumberField, readNumber } from "./number-field";

// One torque figure in every unit a service manual or a wrench may use.
export function TorqueUnitsCard() {
  const [value, setValue] = useState("40");
  const [unit, setUnit] = useState<TorqueUnit>("N·m");
  let rows: Array<[TorqueUnit, number]> = [];
  let error: string | null = null;
  try {
    const n = readNumber("Torque", value);
    rows = TORQUE_UNITS.map((u) => [u, convertTorque(n, unit, u)]);
  } catch (e) {
    error = (e as Error).message;
  }
  return (
    <section aria-labelledby="tq-h" className="rounded-xl border-2 border-steel-300 bg-white p-4">
      <h2 id="tq-h" className="text-2xl font-bold">
        Torque units
      </h2>
      <div className="mt-3 grid grid-cols-2 gap-3">
        <NumberField id="tq-v" label="Torque" unit={unit} value={value} onChange={setValue} />
        <label htmlFor="tq-u" className="flex flex-col gap-1 text-base font-bold">
          Unit
          <select
            id="tq-u"
            value={unit}
            onChange={(e) => setUnit(e.target.value as TorqueUnit)}
            className="min-h-12 rounded-lg border-2 border-steel-700 bg-white px-3 text-lg"
          >
            {TORQUE_UNITS.map((u) => (
              <option key={u}>{u}</option>
            ))}
          </select>
        </label>
      </div>
      {error ? (
        <p role="alert" className="mt-2 font-bold text-fail">
          {error}
        </p>
      ) : (
        <ul className="mt-2 grid grid-cols-2 gap-1 font-mono text-lg" data-testid="torque-result">
          {rows.map(([u, x]) => (
            <li key={u}>
              {Number.parseFloat(x.toPrecision(5))} {u}
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
