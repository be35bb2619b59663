import { zodResolver } from '@hookform/resolvers/zod';
import { useMutation } from '@tanstack/react-query';
import { useForm, type FieldValues, type Path } from 'react-hook-form';
import type { ZodType, ZodTypeDef } from 'zod';
import { api, ApiError } from '../../lib/api-client';

/**
 * react-hook-form with the same zod schema the endpoint uses, submitting through TanStack Query.
 * Field errors from the server land on their fields; anything else becomes the form's message.
 */
export function useApiForm<TIn extends FieldValues, TOut, TRes = unknown>(opts: {
  schema: ZodType<TOut, ZodTypeDef & { typeName: string }, TIn>;
  path: string | ((values: TOut) => string);
  method?: string;
  defaultValues?: Partial<TIn>;
  onSuccess?: (res: TRes, values: TOut) => void;
}) {
  const form = useForm<TIn, unknown, TOut>({
    resolver: zodResolver(opts.schema),
    defaultValues: opts.defaultValues as never,
    mode: 'onTouched',
  });
  const mutation = useMutation<TRes, ApiError, TOut>({
    mutationFn: (values) =>
      api<TRes>(typeof opts.path === 'function' ? opts.path(values) : opts.path, { method: opts.method ?? 'POST', body: values }),
    onSuccess: (res, values) => opts.onSuccess?.(res, values),
    onError: (err) => {
      for (const [name, message] of Object.entries(err.fields ?? {})) {
        form.setError(name as Path<TIn>, { type: 'server', message });
      }
    },
  });
  const onSubmit = form.handleSubmit((values) => mutation.mutate(values));
  return { form, mutation, onSubmit };
}
