import { useMutation, useQuery, useQueryClient } from '@tanstack/react-query';
import { useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { formatMoney } from '../../lib/format';
import { REGIONS, REGION_LABELS, type Region } from '../../lib/listings/constants';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

interface CartItem {
  id: string;
  listingId: string;
  quantity: number;
  title: string;
  unitPriceCents: number;
  currency: string;
  available: number;
  shipsTo: Region[];
  exportControlled: boolean;
  lab: { id: string; name: string };
}

function Cart({ defaultRegion }: { defaultRegion: Region | null }) {
  const qc = useQueryClient();
  const cart = useQuery<{ items: CartItem[]; totals: Record<string, number> }, ApiError>({
    queryKey: ['cart'],
    queryFn: () => api('/api/cart'),
  });
  const [shipTo, setShipTo] = useState<Region | ''>(defaultRegion ?? '');
  const [endUse, setEndUse] = useState<Record<string, string>>({});
  const remove = useMutation<unknown, ApiError, string>({
    mutationFn: (id) => api(`/api/cart/items/${id}`, { method: 'DELETE' }),
    onSuccess: () => qc.invalidateQueries({ queryKey: ['cart'] }),
  });
  const checkout = useMutation<{ checkoutUrl: string }, ApiError>({
    mutationFn: () => api('/api/checkout', { body: { ...(shipTo ? { shipTo } : {}), ...(Object.keys(endUse).length ? { endUse } : {}) } }),
    onSuccess: (r) => window.location.assign(r.checkoutUrl),
  });
  if (cart.isPending) return <p>Loading your cart…</p>;
  if (cart.error) return <FormMessage kind="bad">{cart.error.message}</FormMessage>;
  const items = cart.data.items;
  if (!items.length)
    return (
      <p className="notice">
        Your cart is empty. <a href="/search">Find parts</a>
      </p>
    );
  const labs = [...new Map(items.map((i) => [i.lab.id, i.lab.name])).entries()];
  return (
    <div className="space-y-5">
      {labs.map(([labId, labName]) => (
        <section key={labId} className="sheet p-4">
          <h2 className="mb-2 font-semibold">From {labName}</h2>
          <table className="data-table">
            <thead>
              <tr>
                <th>Part</th>
                <th className="text-right">Qty</th>
                <th className="text-right">Price</th>
                <th>
                  <span className="sr-only">Remove</span>
                </th>
              </tr>
            </thead>
            <tbody>
              {items
                .filter((i) => i.lab.id === labId)
                .map((i) => (
                  <tr key={i.id} data-testid="cart-item">
                    <td>
                      <a href={`/listings/${i.listingId}`}>{i.title}</a>
                      {i.available < i.quantity && <p className="field-error">Only {i.available} left.</p>}
                      {i.exportControlled && (
                        <div className="mt-2">
                          <label className="field-label" htmlFor={`eu-${i.listingId}`}>
                            End-use statement (export-controlled part)
                          </label>
                          <textarea
                            id={`eu-${i.listingId}`}
                            className="field-input min-h-16"
                            value={endUse[i.listingId] ?? ''}
                            onChange={(e) => setEndUse({ ...endUse, [i.listingId]: e.target.value })}
                          />
                          <p className="field-hint">
                            Who uses it, where, for what. Your export-control office and the seller’s decide; see the{' '}
                            <a href="/cautions#export">cautions</a>.
                          </p>
                          {checkout.error?.fields?.[`endUse.${i.listingId}`] && (
                            <p className="field-error">{checkout.error.fields[`endUse.${i.listingId}`]}</p>
                          )}
                        </div>
                      )}
                      {checkout.error?.fields?.[`items.${i.listingId}`] && (
                        <p className="field-error">{checkout.error.fields[`items.${i.listingId}`]}</p>
                      )}
                    </td>
                    <td className="num text-right">{i.quantity}</td>
                    <td className="num text-right">{formatMoney(i.unitPriceCents * i.quantity, i.currency)}</td>
                    <td>
                      <button type="button" className="text-sm text-bad underline" onClick={() => remove.mutate(i.id)}>
                        Remove
                      </button>
                    </td>
                  </tr>
                ))}
            </tbody>
          </table>
        </section>
      ))}
      <section className="sheet p-4">
        <label htmlFor="ship-to" className="field-label">
          Ship to
        </label>
        <select id="ship-to" className="field-input max-w-xs" value={shipTo} onChange={(e) => setShipTo(e.target.value as Region)}>
          <option value="">Choose a region</option>
          {REGIONS.filter((r) => r !== 'WORLD').map((r) => (
            <option key={r} value={r}>
              {REGION_LABELS[r]}
            </option>
          ))}
        </select>
        <p className="mt-3 text-lg font-semibold num">
          Total{' '}
          {Object.entries(cart.data.totals)
            .map(([c, v]) => formatMoney(v, c))
            .join(' + ')}
        </p>
        <p className="field-hint">
          Lightyard holds your payment until you confirm the part arrived (or the 14-day inspection window ends). One order per lab.
        </p>
        {checkout.error && !Object.keys(checkout.error.fields ?? {}).some((k) => k.startsWith('items.') || k.startsWith('endUse.')) && (
          <FormMessage kind="bad">{checkout.error.message}</FormMessage>
        )}
        <button
          type="button"
          className="btn btn-primary mt-3"
          onClick={() => checkout.mutate()}
          disabled={checkout.isPending || checkout.isSuccess}
        >
          {checkout.isPending || checkout.isSuccess ? 'Opening the payment page…' : 'Check out and pay'}
        </button>
      </section>
    </div>
  );
}

export default function CartView(props: { defaultRegion: Region | null }) {
  return (
    <QueryRoot>
      <Cart {...props} />
    </QueryRoot>
  );
}
