import type { FieldErrors, FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';

/**
 * react-hook-form checked by a shared zod schema, with every broken rule of a field in its message
 * (a new password can break several at once, and the person should see all of them).
 */
export function zodResolver<T extends FieldValues>(schema: z.ZodType<T>): Resolver<T> {
  return async (values) => {
    const result = await schema.safeParseAsync(values);
    if (result.success) return { values: result.data, errors: {} };
    const messages = new Map<string, { type: string; message: string }>();
    for (const issue of result.error.issues) {
      const field = issue.path.map(String).join('.') || 'root';
      const seen = messages.get(field);
      if (seen) seen.message = `${seen.message}; ${issue.message}`;
      else messages.set(field, { type: issue.code, message: issue.message });
    }
    return { values: {}, errors: Object.fromEntries(messages) as FieldErrors<T> };
  };
}
