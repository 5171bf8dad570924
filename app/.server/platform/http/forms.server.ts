import { data } from "react-router";
import type { z } from "zod";

export type FieldErrors = Record<string, string>;

/**
 * The first message of each field, keyed by its path ("quantity.y.unit"), or by the form's own
 * field name where `fieldNames` renames a path (a nested schema behind a flat form).
 */
export function fieldErrorsOf(error: z.ZodError, fieldNames: Record<string, string> = {}): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const path = issue.path.join(".") || "form";
    out[fieldNames[path] ?? path] ??= issue.message;
  }
  return out;
}

export type ParsedFields<T> = { ok: true; value: T } | { ok: false; fieldErrors: FieldErrors };

/** Parses the fields of a form already read against its schema. */
export function parseFields<S extends z.ZodType>(form: FormData, schema: S, fieldNames?: Record<string, string>): ParsedFields<z.infer<S>> {
  const result = schema.safeParse(Object.fromEntries(form));
  return result.success ? { ok: true, value: result.data } : { ok: false, fieldErrors: fieldErrorsOf(result.error, fieldNames) };
}

/**
 * How a route reads a form: the request's form data parsed against its schema. Invalid input
 * comes back as a 422 response whose body names each field, for the form to show beside the
 * field.
 */
export async function parseForm<S extends z.ZodType>(
  request: Request,
  schema: S,
  fieldNames?: Record<string, string>,
): Promise<{ ok: true; value: z.infer<S>; form: FormData } | { ok: false; response: ReturnType<typeof invalid> }> {
  const form = await request.formData();
  const parsed = parseFields(form, schema, fieldNames);
  if (!parsed.ok) return { ok: false, response: invalid(parsed.fieldErrors) };
  return { ok: true, value: parsed.value, form };
}

export function invalid(fieldErrors: FieldErrors, message = "Some fields need attention.") {
  return data({ ok: false as const, message, fieldErrors }, { status: 422 });
}
