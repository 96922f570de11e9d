import { useId } from "react";
import type { FieldError, UseFormRegisterReturn } from "react-hook-form";

type Props = { label: string; registration: UseFormRegisterReturn; error?: FieldError; options: { value: string; label: string }[]; hint?: string };

export function SelectField({ label, registration, error, options, hint }: Props) {
  const id = useId();
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      <select id={id} {...registration} aria-invalid={error ? true : undefined} aria-describedby={error ? `${id}-error` : hint ? `${id}-hint` : undefined} className={`rounded-md border bg-paper px-3 py-2 ${error ? "border-clay" : "border-line"}`}>
        {options.map((o) => (
          <option key={o.value} value={o.value}>
            {o.label}
          </option>
        ))}
      </select>
      {hint ? (
        <p id={`${id}-hint`} className="text-xs text-slate">
          {hint}
        </p>
      ) : null}
      {error?.message ? (
        <p id={`${id}-error`} role="alert" className="text-sm font-semibold text-clay">
          {error.message}
        </p>
      ) : null}
    </div>
  );
}
