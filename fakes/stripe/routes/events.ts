import type { StripeFakeContext } from '../context';
import { invalidRequest, resourceMissing } from '../errors';
import type { StripeEvent } from '../events';
import { paginate } from '../list';
import type { Router } from '../router';

export function addEventRoutes(router: Router<StripeFakeContext>): void {
  router.get('/v1/events', (request, { state }) => {
    const { type } = request.query;
    if (type !== undefined && typeof type !== 'string') {
      throw invalidRequest('Invalid string', { param: 'type' });
    }
    const events = state.list<StripeEvent>('event').filter((event) => !type || event.type === type);
    return paginate(events, request.query, '/v1/events', 'event');
  });

  router.get('/v1/events/:id', (request, { state }) => {
    const id = request.params.id ?? '';
    const event = state.get<StripeEvent>('event', id);
    if (!event) throw resourceMissing('event', id);
    return event;
  });
}
