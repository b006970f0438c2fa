"use client";

import { useRouter } from "next/navigation";
import type { FormEvent } from "react";
import { bikeSchema } from "@/lib/office/schemas";
import { api } from "@/app/ui/api-client";
import { useCheckedForm } from "@/app/ui/use-checked-form";
import { buttonClass, Field, FormMessage, inputClass } from "@/app/ui/form-field";

// Add a bike to a customer. The tag code may be left empty: the next one in the shop's series is given.
export function BikeForm({ customerId }: { customerId: string }) {
  const router = useRouter();
  const { errors, message, busy, submit } = useCheckedForm();

  async function onSubmit(e: FormEvent<HTMLFormElement>) {
    e.preventDefault();
    const form = e.currentTarget;
    const values = { ...Object.fromEntries(new FormData(form)), customerId };
    await submit(bikeSchema, values, async () => {
      const r = await api<{ id: string; tagCode: string }>("POST", "/api/office/bikes", values);
      form.reset();
      router.refresh();
      return `Bike added with tag ${r.tagCode}.`;
    });
  }
  const f = (name: string) => ({ id: `bike-${name}`, name, "aria-invalid": Boolean(errors[name]) });
  return (
    <form onSubmit={onSubmit} noValidate className="grid gap-4" data-testid="bike-form">
      <div className="grid gap-4 md:grid-cols-3">
        <Field label="Make" name="bike-make" error={errors.make}>
          <input {...f("make")} className={inputClass} />
        </Field>
        <Field label="Model" name="bike-model" error={errors.model}>
          <input {...f("model")} className={inputClass} />
        </Field>
        <Field label="Year" name="bike-year" error={errors.year}>
          <input {...f("year")} inputMode="numeric" className={inputClass} />
        </Field>
        <Field label="Displacement (cc)" name="bike-displacementCc" error={errors.displacementCc}>
          <input {...f("displacementCc")} inputMode="numeric" className={inputClass} />
        </Field>
        <Field label="Colour" name="bike-colour" error={errors.colour}>
          <input {...f("colour")} className={inputClass} />
        </Field>
        <Field label="Tag code" name="bike-tagCode" error={errors.tagCode} hint="Leave empty for the next free tag">
          <input {...f("tagCode")} className={`${inputClass} font-mono uppercase`} />
        </Field>
        <Field label="VIN / frame number" name="bike-vin" error={errors.vin}>
          <input {...f("vin")} className={`${inputClass} font-mono`} />
        </Field>
        <Field label="Engine number" name="bike-engineNumber" error={errors.engineNumber}>
          <input {...f("engineNumber")} className={`${inputClass} font-mono`} />
        </Field>
      </div>
      <FormMessage error={message.error} ok={message.ok} />
      <div>
        <button type="submit" disabled={busy} className={buttonClass}>
          Add bike
        </button>
      </div>
    </form>
  );
}
