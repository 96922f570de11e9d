import { useId } from "react";
import type { FieldError, UseFormRegisterReturn } from "react-hook-form";

type Props = {
  label: string;
  registration: UseFormRegisterReturn;
  error?: FieldError;
  hint?: string;
} & Omit<React.InputHTMLAttributes<HTMLInputElement>, "name" | "onChange" | "onBlur" | "ref">;

/** A labelled input whose error is announced and tied to it with aria-describedby. */
export function Field({ label, registration, error, hint, ...input }: Props) {
  const id = useId();
  const hintId = `${id}-hint`;
  const errorId = `${id}-error`;
  const describedBy = [hint ? hintId : null, error ? errorId : null].filter(Boolean).join(" ") || undefined;
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold">
        {label}
      </label>
      <input
        id={id}
        {...input}
        {...registration}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy}
        className={`rounded-md border bg-paper px-3 py-2 ${error ? "border-clay" : "border-line"}`}
      />
      {hint ? (
        <p id={hintId} className="text-xs text-slate">
          {hint}
        </p>
      ) : null}
      {error?.message ? (
        <p id={errorId} role="alert" className="text-sm font-semibold text-clay">
          {error.message}
        </p>
      ) : null}
    </div>
  );
}
