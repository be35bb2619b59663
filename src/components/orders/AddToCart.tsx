import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

function Add({ listingId, available }: { listingId: string; available: number }) {
  const [qty, setQty] = useState(1);
  const m = useMutation<unknown, ApiError>({ mutationFn: () => api('/api/cart/items', { body: { listingId, quantity: qty } }) });
  return (
    <div>
      {m.isSuccess && (
        <FormMessage kind="good">
          In your cart. <a href="/cart">Go to the cart</a>
        </FormMessage>
      )}
      {m.error && <FormMessage kind="bad">{m.error.message}</FormMessage>}
      <div className="flex items-end gap-2">
        <div>
          <label htmlFor="qty" className="field-label">
            Quantity
          </label>
          <input
            id="qty"
            type="number"
            min={1}
            max={available}
            className="field-input num w-20"
            value={qty}
            onChange={(e) => setQty(Math.max(1, Math.min(available, Number(e.target.value) || 1)))}
          />
        </div>
        <button type="button" className="btn btn-primary" onClick={() => m.mutate()} disabled={m.isPending}>
          Add to cart
        </button>
      </div>
    </div>
  );
}

export default function AddToCart(props: { listingId: string; available: number }) {
  return (
    <QueryRoot>
      <Add {...props} />
    </QueryRoot>
  );
}
