import { zodResolver } from '@hookform/resolvers/zod';
import type { FieldValues, Resolver } from 'react-hook-form';
import type { z } from 'zod';

/**
 * For a form whose fields are not the request body one to one (text typed for numbers, one input
 * that fills one of several keys): the shared schema checks the body the form would send, so the
 * person sees the server's own messages before anything is sent. The errors sit at the body's paths
 * (the same paths a refused save names), and the submit handler gets the parsed body.
 */
export function bodyResolver<TForm extends FieldValues, TBody extends FieldValues, TOut extends FieldValues>(
  schema: z.ZodType<TOut, TBody>,
  toBody: (values: TForm) => TBody,
): Resolver<TForm, unknown, TOut> {
  const check = zodResolver(schema);
  return (values, context, options) =>
    check(toBody(values), context, options as unknown as Parameters<typeof check>[2]) as unknown as ReturnType<
      Resolver<TForm, unknown, TOut>
    >;
}
