import type { UseMutationOptions } from '@tanstack/react-query';

/** What a component may add to a data hook's mutation: its own reactions (form errors, navigation). */
export type MutationHandlers<TData, TVars> = Pick<
  UseMutationOptions<TData, Error, TVars>,
  'onMutate' | 'onSuccess' | 'onError' | 'onSettled'
>;

/**
 * The hook's cache update first, then the caller's onSuccess: the cache stays right whatever the
 * component does with the answer.
 */
export function afterSuccess<TData, TVars>(
  own: (data: TData, vars: TVars) => void,
  handlers: MutationHandlers<TData, TVars> = {},
): MutationHandlers<TData, TVars> {
  return {
    ...handlers,
    onSuccess: (data, vars, result, context) => {
      own(data, vars);
      return handlers.onSuccess?.(data, vars, result, context);
    },
  };
}
