"use client";

// A row of large buttons of which one is chosen (aria-pressed), for unit and curve switches.
export function ToggleGroup<T extends string>({
  label,
  options,
  value,
  onChange,
}: {
  label: string;
  options: ReadonlyArray<{ value: T; label: string }>;
  value: T;
  onChange: (v: T) => void;
}) {
  return (
    <fieldset className="flex flex-col gap-1">
      <legend className="text-base font-bold">{label}</legend>
      <div className="flex gap-2">
        {options.map((o) => (
          <button
            key={o.value}
            type="button"
            aria-pressed={o.value === value}
            onClick={() => onChange(o.value)}
            className={`min-h-target min-w-target rounded-lg border-2 px-4 text-lg font-bold ${
              o.value === value ? "border-ink bg-ink text-white" : "border-steel-700 bg-white text-ink"
            }`}
          >
            {o.value === value && <span aria-hidden="true">✓ </span>}
            {o.label}
          </button>
        ))}
      </div>
    </fieldset>
  );
}
