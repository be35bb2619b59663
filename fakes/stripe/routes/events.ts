import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import type { StripeEvent } from '../events';
import { paginate, rangeFilter } from '../list';
import type { FormObject } from '../form-body';
import type { Router } from '../router';

/** `type` (one, `*` wildcards allowed as on the provider) or `types[]` (several). */
function typeFilter(query: FormObject): (event: StripeEvent) => boolean {
  const { type, types } = query;
  if (type !== undefined && typeof type !== 'string') throw invalidRequest('Invalid string', { param: 'type' });
  if (types !== undefined && (!Array.isArray(types) || types.some((entry) => typeof entry !== 'string'))) {
    throw invalidRequest('Invalid array', { param: 'types' });
  }
  const patterns = [...(type ? [type] : []), ...((types as string[] | undefined) ?? [])].map(
    (pattern) =>
      new RegExp(
        `^${pattern
          .split('*')
          .map((part) => part.replace(/[.+?^${}()|[\]\\]/g, '\\$&'))
          .join('.*')}$`,
      ),
  );
  return (event) => patterns.length === 0 || patterns.some((pattern) => pattern.test(event.type));
}

/** Events of the platform, or of the connected account named by `Stripe-Account`. */
export function addEventRoutes(router: Router<StripeFakeContext>): void {
  router.get('/v1/events', (request, { state }) => {
    const filters = [typeFilter(request.query), rangeFilter(request.query, 'created')];
    const events = state.list<StripeEvent>('event', request.account).filter((event) => filters.every((keep) => keep(event)));
    return paginate(events, request.query, '/v1/events', 'event');
  });

  router.get('/v1/events/:id', (request, { state }) => {
    const id = request.params.id ?? '';
    const event = state.get<StripeEvent>('event', id, request.account);
    if (!event) throw resourceMissing('event', id);
    return event;
  });
}
