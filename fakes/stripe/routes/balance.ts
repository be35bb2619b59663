import type { StripeFakeContext } from '../context';
import type { Router } from '../router';

export function addBalanceRoutes(router: Router<StripeFakeContext>): void {
  router.get('/v1/balance', () => ({
    object: 'balance',
    available: [],
    pending: [],
    livemode: false,
  }));
}
