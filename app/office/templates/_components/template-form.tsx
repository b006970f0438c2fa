"use client";

import type { ReactNode } from "react";
import { CAUTION_KINDS, type TemplateDocumentInput } from "@/lib/procedures/template-schema";
import { listText, parseList, parsePasses, passesText, setAt } from "@/lib/procedures/template-form";
import { MEASUREMENT_UNITS } from "@/lib/calc/units";

type Doc = TemplateDocumentInput;
type Path = Array<string | number>;
type Step = Doc["stages"][number]["steps"][number];

const small = "min-h-11 rounded-lg border-2 border-steel-700 bg-white px-2 text-base aria-[invalid=true]:border-fail";
const addBtn = "min-h-11 rounded-lg border-2 border-steel-700 bg-white px-3 font-bold";
const removeBtn = "min-h-11 rounded-lg border-2 border-fail bg-white px-3 font-bold text-fail";

const newStep = (n: number): Step => ({
  key: `step-${n}`,
  title: "New step",
  instructions: "",
  cautions: [],
  requiresPhoto: false,
  torque: [],
  measurements: [],
  timer: null,
});

// The template as a structured form: stages, steps, cautions, torque specs, measurement specs and
// timers. Each field shows its own problem from the live schema check (`errors` keyed by path).
export function TemplateForm({ doc, onChange, errors }: { doc: Doc; onChange: (d: Doc) => void; errors: Record<string, string> }) {
  const set = (path: Path, value: unknown) => onChange(setAt(doc, path, value));
  const err = (path: Path) => errors[path.join(".")];
  const text = (label: string, path: Path, value: string | undefined, opts: { mono?: boolean; wide?: boolean; area?: boolean } = {}) => (
    <Cell label={label} error={err(path)} wide={opts.wide}>
      {opts.area ? (
        <textarea
          aria-label={label}
          value={value ?? ""}
          onChange={(e) => set(path, e.target.value)}
          rows={3}
          className={`${small} w-full py-1`}
          aria-invalid={Boolean(err(path))}
        />
      ) : (
        <input
          aria-label={label}
          value={value ?? ""}
          onChange={(e) => set(path, e.target.value)}
          className={`${small} w-full ${opts.mono ? "font-mono" : ""}`}
          aria-invalid={Boolean(err(path))}
        />
      )}
    </Cell>
  );
  const num = (label: string, path: Path, value: number | null | undefined, nullable = false) => (
    <Cell label={label} error={err(path)}>
      <input
        aria-label={label}
        type="number"
        step="any"
        value={value === null || value === undefined || Number.isNaN(value) ? "" : value}
        onChange={(e) => set(path, e.target.value === "" ? (nullable ? null : Number.NaN) : e.target.valueAsNumber)}
        className={`${small} w-full font-mono`}
        aria-invalid={Boolean(err(path))}
      />
    </Cell>
  );
  const select = (label: string, path: Path, value: string | null | undefined, options: readonly string[], empty?: string) => (
    <Cell label={label} error={err(path)}>
      <select
        aria-label={label}
        value={value ?? ""}
        onChange={(e) => set(path, e.target.value === "" ? null : e.target.value)}
        className={`${small} w-full`}
      >
        {empty && <option value="">{empty}</option>}
        {options.map((o) => (
          <option key={o} value={o}>
            {o}
          </option>
        ))}
      </select>
    </Cell>
  );

  return (
    <div className="grid gap-4" data-testid="template-form">
      <div className="grid gap-3 md:grid-cols-[1fr_2fr]">
        {text("Template key", ["key"], doc.key, { mono: true })}
        {text("Name", ["name"], doc.name)}
      </div>
      {text("Summary", ["summary"], doc.summary, { area: true })}
      <label className="flex min-h-11 items-center gap-3 font-bold">
        <input
          type="checkbox"
          className="h-6 w-6"
          checked={Boolean(doc.exampleOnly)}
          onChange={(e) => set(["exampleOnly"], e.target.checked)}
        />
        Example figures only (to be replaced by the maker&apos;s service data)
      </label>
      {doc.stages.map((stage, si) => (
        <fieldset key={si} className="rounded-xl border-2 border-steel-700 bg-white p-3" data-testid="form-stage">
          <legend className="px-2 text-xl font-bold">Stage {si + 1}</legend>
          <div className="grid gap-3 md:grid-cols-[1fr_2fr_auto]">
            {text("Stage key", ["stages", si, "key"], stage.key, { mono: true })}
            {text("Stage title", ["stages", si, "title"], stage.title)}
            <button
              type="button"
              className={`${removeBtn} self-end`}
              disabled={doc.stages.length === 1}
              onClick={() =>
                set(
                  ["stages"],
                  doc.stages.filter((_, j) => j !== si),
                )
              }
            >
              Remove stage
            </button>
          </div>
          {stage.steps.map((step, pi) => {
            const sp: Path = ["stages", si, "steps", pi];
            return (
              <details
                key={pi}
                className="mt-3 rounded-lg border-2 border-steel-300 p-3"
                open={Boolean(Object.keys(errors).some((k) => k.startsWith(sp.join(".") + ".")))}
              >
                <summary className="cursor-pointer text-lg font-bold">
                  Step {pi + 1}: {step.title}{" "}
                  {Object.keys(errors).some((k) => k.startsWith(sp.join(".") + ".")) && (
                    <span className="text-fail">✖ needs attention</span>
                  )}
                </summary>
                <div className="mt-2 grid gap-3 md:grid-cols-[1fr_2fr]">
                  {text("Step key", [...sp, "key"], step.key, { mono: true })}
                  {text("Step title", [...sp, "title"], step.title)}
                </div>
                <div className="mt-2">{text("Instructions", [...sp, "instructions"], step.instructions, { area: true })}</div>
                <label className="mt-2 flex min-h-11 items-center gap-3 font-bold">
                  <input
                    type="checkbox"
                    className="h-6 w-6"
                    checked={Boolean(step.requiresPhoto)}
                    onChange={(e) => set([...sp, "requiresPhoto"], e.target.checked)}
                  />
                  A photo is required
                </label>

                <Group
                  title="Cautions"
                  onAdd={() => set([...sp, "cautions"], [...(step.cautions ?? []), { kind: "general", text: "" }])}
                  addLabel="+ Caution"
                >
                  {(step.cautions ?? []).map((c, ci) => (
                    <Row
                      key={ci}
                      onRemove={() =>
                        set(
                          [...sp, "cautions"],
                          (step.cautions ?? []).filter((_, j) => j !== ci),
                        )
                      }
                    >
                      {select("Caution kind", [...sp, "cautions", ci, "kind"], c.kind, CAUTION_KINDS)}
                      {text("Caution text", [...sp, "cautions", ci, "text"], c.text, { wide: true })}
                    </Row>
                  ))}
                </Group>

                <Group
                  title="Torque specs"
                  onAdd={() =>
                    set(
                      [...sp, "torque"],
                      [
                        ...(step.torque ?? []),
                        {
                          label: "",
                          finalValue: Number.NaN,
                          unit: "N·m",
                          passes: [{ percent: 50 }, { percent: 100 }],
                          anglePasses: [],
                          pattern: "cross",
                          boltCount: 4,
                          lubricant: "",
                          torqueToYield: false,
                        },
                      ],
                    )
                  }
                  addLabel="+ Torque spec"
                >
                  {(step.torque ?? []).map((t, ti) => {
                    const tp: Path = [...sp, "torque", ti];
                    return (
                      <Row
                        key={ti}
                        onRemove={() =>
                          set(
                            [...sp, "torque"],
                            (step.torque ?? []).filter((_, j) => j !== ti),
                          )
                        }
                      >
                        {text("Torque label", [...tp, "label"], t.label)}
                        {num("Final value", [...tp, "finalValue"], t.finalValue)}
                        {select("Unit", [...tp, "unit"], t.unit, ["N·m", "lbf·ft", "lbf·in", "kgf·m"])}
                        <Cell
                          label="Passes (e.g. 30%, 70%, 100%)"
                          error={
                            err([...tp, "passes"]) ??
                            Object.entries(errors).find(([k]) => k.startsWith([...tp, "passes"].join(".") + "."))?.[1]
                          }
                        >
                          <input
                            aria-label="Passes"
                            defaultValue={passesText(t.passes)}
                            onBlur={(e) => set([...tp, "passes"], parsePasses(e.target.value))}
                            className={`${small} w-full font-mono`}
                          />
                        </Cell>
                        <Cell
                          label="Angle passes (degrees)"
                          error={
                            err([...tp, "anglePasses"]) ??
                            Object.entries(errors).find(([k]) => k.startsWith([...tp, "anglePasses"].join(".") + "."))?.[1]
                          }
                        >
                          <input
                            aria-label="Angle passes"
                            defaultValue={listText(t.anglePasses)}
                            onBlur={(e) => set([...tp, "anglePasses"], parseList(e.target.value).map(Number))}
                            className={`${small} w-full font-mono`}
                          />
                        </Cell>
                        {select("Pattern", [...tp, "pattern"], t.pattern, ["cross", "spiral-out", "linear"])}
                        {num("Bolt count", [...tp, "boltCount"], t.boltCount)}
                        {text("Lubricant", [...tp, "lubricant"], t.lubricant)}
                        <label className="flex min-h-11 items-center gap-2 self-end font-bold">
                          <input
                            type="checkbox"
                            className="h-6 w-6"
                            checked={Boolean(t.torqueToYield)}
                            onChange={(e) => set([...tp, "torqueToYield"], e.target.checked)}
                          />
                          Torque-to-yield
                        </label>
                      </Row>
                    );
                  })}
                </Group>

                <Group
                  title="Measurement specs"
                  onAdd={() =>
                    set(
                      [...sp, "measurements"],
                      [
                        ...(step.measurements ?? []),
                        {
                          key: `reading-${(step.measurements ?? []).length + 1}`,
                          label: "",
                          nominal: null,
                          min: Number.NaN,
                          max: Number.NaN,
                          unit: "mm",
                          readingLabels: [],
                          geometry: null,
                        },
                      ],
                    )
                  }
                  addLabel="+ Measurement spec"
                >
                  {(step.measurements ?? []).map((m, mi) => {
                    const mp: Path = [...sp, "measurements", mi];
                    return (
                      <Row
                        key={mi}
                        onRemove={() =>
                          set(
                            [...sp, "measurements"],
                            (step.measurements ?? []).filter((_, j) => j !== mi),
                          )
                        }
                      >
                        {text("Measurement key", [...mp, "key"], m.key, { mono: true })}
                        {text("Measurement label", [...mp, "label"], m.label)}
                        {num("Nominal", [...mp, "nominal"], m.nominal, true)}
                        {num("Min", [...mp, "min"], m.min)}
                        {num("Max", [...mp, "max"], m.max)}
                        {select("Unit", [...mp, "unit"], m.unit, MEASUREMENT_UNITS)}
                        <Cell label="Readings (labels, comma-separated)" error={err([...mp, "readingLabels"])}>
                          <input
                            aria-label="Reading labels"
                            defaultValue={listText(m.readingLabels)}
                            onBlur={(e) => set([...mp, "readingLabels"], parseList(e.target.value))}
                            className={`${small} w-full`}
                          />
                        </Cell>
                        {select("Geometry", [...mp, "geometry"], m.geometry, ["bore", "oil-clearance"], "none")}
                      </Row>
                    );
                  })}
                </Group>

                <Group
                  title="Timer"
                  onAdd={step.timer ? undefined : () => set([...sp, "timer"], { label: "", durationS: 600, blocksStepKey: null })}
                  addLabel="+ Timer"
                >
                  {step.timer && (
                    <Row onRemove={() => set([...sp, "timer"], null)}>
                      {text("Timer label", [...sp, "timer", "label"], step.timer.label)}
                      {num("Duration (seconds)", [...sp, "timer", "durationS"], step.timer.durationS)}
                      {select(
                        "Blocks step",
                        [...sp, "timer", "blocksStepKey"],
                        step.timer.blocksStepKey,
                        doc.stages.flatMap((s) => s.steps.map((x) => x.key)),
                        "no step",
                      )}
                    </Row>
                  )}
                </Group>
                <div className="mt-3 flex flex-wrap gap-2">
                  <button
                    type="button"
                    className={removeBtn}
                    disabled={stage.steps.length === 1}
                    onClick={() =>
                      set(
                        ["stages", si, "steps"],
                        stage.steps.filter((_, j) => j !== pi),
                      )
                    }
                  >
                    Remove step
                  </button>
                </div>
              </details>
            );
          })}
          <button
            type="button"
            className={`${addBtn} mt-3`}
            onClick={() => set(["stages", si, "steps"], [...stage.steps, newStep(doc.stages.reduce((n, s) => n + s.steps.length, 0) + 1)])}
          >
            + Step
          </button>
        </fieldset>
      ))}
      <div>
        <button
          type="button"
          className={addBtn}
          onClick={() =>
            set(
              ["stages"],
              [
                ...doc.stages,
                {
                  key: `stage-${doc.stages.length + 1}`,
                  title: "New stage",
                  steps: [newStep(doc.stages.reduce((n, s) => n + s.steps.length, 0) + 1)],
                },
              ],
            )
          }
        >
          + Stage
        </button>
      </div>
    </div>
  );
}

function Cell({ label, error, wide, children }: { label: string; error?: string; wide?: boolean; children: ReactNode }) {
  return (
    <div className={`flex flex-col gap-1 ${wide ? "md:col-span-2" : ""}`}>
      <span className="text-sm font-bold">{label}</span>
      {children}
      {error && <span className="text-sm font-bold text-fail">✖ {error}</span>}
    </div>
  );
}

function Group({ title, onAdd, addLabel, children }: { title: string; onAdd?: () => void; addLabel: string; children: ReactNode }) {
  return (
    <div className="mt-3">
      <div className="flex items-center gap-3">
        <h4 className="font-bold">{title}</h4>
        {onAdd && (
          <button type="button" className={addBtn} onClick={onAdd}>
            {addLabel}
          </button>
        )}
      </div>
      <div className="mt-1 grid gap-2">{children}</div>
    </div>
  );
}

function Row({ onRemove, children }: { onRemove: () => void; children: ReactNode }) {
  return (
    <div className="grid items-start gap-2 rounded-lg bg-steel-50 p-2 md:grid-cols-4">
      {children}
      <button type="button" className={`${removeBtn} self-end`} onClick={onRemove}>
        Remove
      </button>
    </div>
  );
}
