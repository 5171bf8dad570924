import { data } from "react-router";
import type { z } from "zod";

export type FieldErrors = Record<string, string>;

export function fieldErrorsOf(error: z.ZodError): FieldErrors {
  const out: FieldErrors = {};
  for (const issue of error.issues) {
    const key = issue.path.join(".") || "form";
    out[key] ??= issue.message;
  }
  return out;
}

/**
 * Parses a form against its schema. Invalid input comes back as a 422 response whose body names
 * each field, for the form to show beside the field.
 */
export async function parseForm<S extends z.ZodType>(
  request: Request,
  schema: S,
): Promise<{ ok: true; value: z.infer<S>; form: FormData } | { ok: false; response: ReturnType<typeof invalid> }> {
  const form = await request.formData();
  const result = schema.safeParse(Object.fromEntries(form));
  if (!result.success) return { ok: false, response: invalid(fieldErrorsOf(result.error)) };
  return { ok: true, value: result.data, form };
}

export function invalid(fieldErrors: FieldErrors, message = "Some fields need attention.") {
  return data({ ok: false as const, message, fieldErrors }, { status: 422 });
}
