"use client";

import type { ElementType, InputHTMLAttributes, ReactNode, SelectHTMLAttributes, TextareaHTMLAttributes } from "react";
import { get, type FieldValues, type Path, type RegisterOptions, type UseFormReturn } from "react-hook-form";
import { Field, inputClass, SelectOptions } from "@/app/_components/field";

/** What every form-bound field takes: the react-hook-form form, the field's path, its label and hint. */
type Bound<T extends FieldValues> = {
  form: UseFormReturn<T>;
  name: Path<T>;
  label: string;
  hint?: string;
  /** The input's id (and the stem of its hint and error ids); the path when not given. */
  id?: string;
  rules?: RegisterOptions<T, Path<T>>;
};

type Own = "form" | "name" | "id";

/**
 * The zod error at a path (nested paths too) and the props that bind an input to it: register's handlers,
 * `aria-invalid`, and `aria-describedby` pointing at the error when there is one, else at the hint.
 */
export function useFieldBinding<T extends FieldValues>({ form, name, id = name, hint, rules }: Omit<Bound<T>, "label">) {
  const error = get(form.formState.errors, name) as { message?: string } | undefined;
  const message = error?.message;
  return {
    id,
    error: message,
    props: {
      id,
      "aria-invalid": Boolean(error),
      "aria-describedby": message ? `${id}-error` : hint ? `${id}-hint` : undefined,
      ...form.register(name, rules),
    },
  };
}

/**
 * Splits a bound field's props: what the Field wrapper shows (id, label, hint, error) and what goes on the element
 * (the caller's HTML attributes, the input class unless told otherwise, and the binding).
 */
function useBound<T extends FieldValues, A extends object>({ form, name, label, hint, id, rules, className = inputClass, ...html }: Bound<T> & A & { className?: string }) {
  const bound = useFieldBinding({ form, name, id, hint, rules });
  return { field: { id: bound.id, label, hint, error: bound.error }, element: { className, ...html, ...bound.props } };
}

/** The element a bound field holds, with the HTML attributes it takes. */
type Elements = { input: InputHTMLAttributes<HTMLInputElement>; textarea: TextareaHTMLAttributes<HTMLTextAreaElement>; select: SelectHTMLAttributes<HTMLSelectElement> };

const TAGS: Record<keyof Elements, ElementType> = { input: "input", textarea: "textarea", select: "select" };

/** A Field (label, hint, error) around one element bound to the form: what every field below draws. */
function BoundField<T extends FieldValues>({ as, children, ...props }: Bound<T> & Omit<Elements[keyof Elements], Own> & { as: keyof Elements }) {
  const { field, element } = useBound(props);
  const Element = TAGS[as];
  return (
    <Field {...field}>
      <Element {...element}>{children}</Element>
    </Field>
  );
}

/** A labelled text-like input (text, e-mail, password, date, month…) bound to the form. */
export function TextField<T extends FieldValues>(props: Bound<T> & Omit<InputHTMLAttributes<HTMLInputElement>, Own>) {
  return <BoundField as="input" {...props} />;
}

/** A labelled number input bound to the form (type="number" unless told otherwise). */
export function NumberField<T extends FieldValues>(props: Bound<T> & Omit<InputHTMLAttributes<HTMLInputElement>, Own>) {
  return <TextField type="number" {...props} />;
}

/** A labelled text area bound to the form. */
export function TextAreaField<T extends FieldValues>(props: Bound<T> & Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, Own>) {
  return <BoundField as="textarea" {...props} />;
}

/** A labelled select bound to the form; the options are its children, or `options` as [value, label] pairs (e.g. a label table's entries). */
export function SelectField<T extends FieldValues>({
  children,
  options,
  ...props
}: Bound<T> & Omit<SelectHTMLAttributes<HTMLSelectElement>, Own> & { children?: ReactNode; options?: [string, ReactNode][] }) {
  return (
    <BoundField as="select" {...props}>
      {options ? <SelectOptions options={options} /> : null}
      {children}
    </BoundField>
  );
}

/** A checkbox with its text beside it, the whole line its label, bound to the form. */
export function CheckboxField<T extends FieldValues>({
  form,
  name,
  children,
  className = "flex items-start gap-2 text-sm",
  inputClassName = "mt-1",
}: {
  form: UseFormReturn<T>;
  name: Path<T>;
  children: ReactNode;
  className?: string;
  inputClassName?: string;
}) {
  return (
    <label className={className}>
      <input type="checkbox" className={inputClassName} {...form.register(name)} />
      <span>{children}</span>
    </label>
  );
}

/** Puts the server's per-field messages (ApiError.fields) on the form's fields. */
export function setFieldErrors<T extends FieldValues>(form: Pick<UseFormReturn<T>, "setError">, fields: Record<string, string> | undefined) {
  if (!fields) return;
  for (const [field, message] of Object.entries(fields)) form.setError(field as Path<T>, { message });
}
