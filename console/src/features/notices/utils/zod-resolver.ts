import type { FieldErrors, FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';

/**
 * react-hook-form checked by the shared zod schema the gateway uses, so the form refuses what the
 * gateway would, with the same words, field by field (nested paths such as travelTimes.2.releaseM3s).
 */
export function zodResolver<T extends FieldValues>(schema: z.ZodType<T>): Resolver<T> {
  return formResolver(
    schema,
    (v: T) => v,
    (v) => v,
  );
}

/**
 * The same, for a form whose fields are in the units people type (minutes) while the schema is in
 * the API's (seconds): `toInput` converts, `renameField` maps a schema field back to its form field.
 * The form keeps its own values; the converted input is checked and handed to onSubmit's caller.
 */
export function formResolver<F extends FieldValues, I>(
  schema: z.ZodType<I>,
  toInput: (form: F) => unknown,
  renameField: (field: string) => string,
): Resolver<F> {
  return async (values) => {
    const result = schema.safeParse(toInput(values));
    if (result.success) return { values, errors: {} };
    const errors: Record<string, unknown> = {};
    for (const issue of result.error.issues) {
      const path = issue.path.map((p) => renameField(String(p)));
      let node = errors;
      path.slice(0, -1).forEach((key) => {
        node[key] ??= {};
        node = node[key] as Record<string, unknown>;
      });
      const leaf = path.at(-1) ?? 'root';
      node[leaf] ??= { type: issue.code, message: issue.message };
    }
    return { values: {}, errors: errors as FieldErrors<F> };
  };
}
