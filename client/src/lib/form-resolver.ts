import type { FieldErrors, FieldValues, Resolver } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { plainSentence } from "@shared/validation-messages";

type Node = { message?: unknown; ref?: unknown; [key: string]: unknown };

/** Rewrites every message of a react-hook-form error tree as a plain sentence naming its field. */
export function plainErrors<T extends FieldValues>(
  errors: FieldErrors<T>,
  path: (string | number)[] = [],
): FieldErrors<T> {
  for (const [key, value] of Object.entries(errors as Record<string, Node | undefined>)) {
    if (!value || typeof value !== "object" || key === "ref") continue;
    const here = [...path, /^\d+$/.test(key) ? Number(key) : key];
    if (typeof value.message === "string") value.message = plainSentence(here, value.message);
    plainErrors(value as FieldErrors, here);
  }
  return errors;
}

/**
 * The forms' one resolver, used like zodResolver: the shared zod contract checks the values (in the wording of
 * shared/validation-messages.ts), and messages a schema wrote itself become sentences naming the field too.
 */
export const formResolver = ((...args: Parameters<typeof zodResolver>) => {
  const inner = (zodResolver as (...a: unknown[]) => Resolver<FieldValues>)(...args);
  const resolver: Resolver<FieldValues> = async (values, context, options) => {
    const result = await inner(values, context, options);
    plainErrors(result.errors);
    return result;
  };
  return resolver;
}) as typeof zodResolver;
