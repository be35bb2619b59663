import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

interface Props {
  orderId: string;
  side: 'buyer' | 'lab' | 'staff';
  status: string;
  staff: boolean;
  remainingCents: number;
}

function Actions({ orderId, side, status, staff, remainingCents }: Props) {
  const [carrier, setCarrier] = useState('');
  const [tracking, setTracking] = useState('');
  const [reason, setReason] = useState('');
  const [amount, setAmount] = useState('');
  const done = () => window.location.reload();
  const ship = useMutation<unknown, ApiError>({
    mutationFn: () => api(`/api/orders/${orderId}/ship`, { body: { carrier, trackingNumber: tracking } }),
    onSuccess: done,
  });
  const confirm = useMutation<unknown, ApiError>({
    mutationFn: () => api(`/api/orders/${orderId}/confirm-receipt`, { body: {} }),
    onSuccess: done,
  });
  const refund = useMutation<unknown, ApiError>({
    mutationFn: () =>
      api(`/api/orders/${orderId}/refund`, { body: { reason, ...(amount ? { amountCents: Math.round(Number(amount) * 100) } : {}) } }),
    onSuccess: done,
  });
  const err = ship.error ?? confirm.error ?? refund.error;
  return (
    <div className="space-y-4 print:hidden">
      {err && <FormMessage kind="bad">{Object.values(err.fields ?? {})[0] ?? err.message}</FormMessage>}
      {side === 'lab' && status === 'paid' && (
        <div>
          <h3 className="mb-2 font-semibold">Mark shipped</h3>
          <label className="field-label" htmlFor="carrier">
            Carrier
          </label>
          <input id="carrier" className="field-input mb-2" value={carrier} onChange={(e) => setCarrier(e.target.value)} />
          <label className="field-label" htmlFor="tracking">
            Tracking number
          </label>
          <input id="tracking" className="field-input mb-2" value={tracking} onChange={(e) => setTracking(e.target.value)} />
          <button type="button" className="btn btn-primary" disabled={ship.isPending} onClick={() => ship.mutate()}>
            Mark shipped
          </button>
        </div>
      )}
      {side === 'buyer' && status === 'shipped' && (
        <button type="button" className="btn btn-primary" disabled={confirm.isPending} onClick={() => confirm.mutate()}>
          I received the part and it is as described
        </button>
      )}
      {side === 'buyer' && (status === 'paid' || status === 'shipped') && (
        <details>
          <summary className="cursor-pointer text-sm">Ask for a refund</summary>
          <label className="field-label mt-2" htmlFor="reason">
            What is wrong?
          </label>
          <textarea id="reason" className="field-input min-h-16" value={reason} onChange={(e) => setReason(e.target.value)} />
          <button type="button" className="btn btn-quiet mt-2" disabled={refund.isPending} onClick={() => refund.mutate()}>
            Ask for a refund
          </button>
        </details>
      )}
      {staff && side === 'staff' && remainingCents > 0 && ['paid', 'shipped', 'received', 'refund_requested'].includes(status) && (
        <div>
          <h3 className="mb-2 font-semibold">Refund (moderator)</h3>
          <label className="field-label" htmlFor="amount">
            Amount (empty = everything left)
          </label>
          <input
            id="amount"
            inputMode="decimal"
            className="field-input mb-2 w-40"
            value={amount}
            onChange={(e) => setAmount(e.target.value)}
          />
          <label className="field-label" htmlFor="reason-staff">
            Reason
          </label>
          <textarea id="reason-staff" className="field-input min-h-16" value={reason} onChange={(e) => setReason(e.target.value)} />
          <button type="button" className="btn btn-quiet mt-2" disabled={refund.isPending} onClick={() => refund.mutate()}>
            Refund
          </button>
        </div>
      )}
    </div>
  );
}

export default function OrderActions(props: Props) {
  return (
    <QueryRoot>
      <Actions {...props} />
    </QueryRoot>
  );
}
