import { useMutation } from '@tanstack/react-query';
import Papa from 'papaparse';
import { api, type ApiError } from '../../lib/api-client';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';
import { Plot } from '../tools/Plot';

interface Props {
  labId: string;
  isOwner: boolean;
  account: { payoutsEnabled: boolean; detailsSubmitted: boolean } | null;
  transfers: {
    id: string;
    orderId: string;
    amountCents: number;
    currency: string;
    createdAt: string;
    subtotalCents: number;
    feeCents: number;
    buyer: string;
  }[];
  monthly: { month: string; currency: string; cents: number }[];
}

function download(rows: Props['transfers']) {
  const csv = Papa.unparse(
    rows.map((t) => ({
      date: t.createdAt.slice(0, 10),
      order: t.orderId,
      buyer: t.buyer,
      price: (t.subtotalCents / 100).toFixed(2),
      fee: (t.feeCents / 100).toFixed(2),
      transferred: (t.amountCents / 100).toFixed(2),
      currency: t.currency,
      transfer: t.id,
    })),
  );
  const url = URL.createObjectURL(new Blob([csv], { type: 'text/csv' }));
  const a = document.createElement('a');
  a.href = url;
  a.download = 'lightyard-transfers.csv';
  a.click();
  URL.revokeObjectURL(url);
}

function View({ labId, isOwner, account, transfers, monthly }: Props) {
  const onboard = useMutation<{ url: string }, ApiError>({
    mutationFn: () => api('/api/payouts/onboarding', { body: { labId } }),
    onSuccess: (r) => window.location.assign(r.url),
  });
  const currencies = [...new Set(monthly.map((m) => m.currency))];
  const months = [...new Set(monthly.map((m) => m.month))].sort();
  return (
    <div className="space-y-5">
      {!account?.payoutsEnabled && (
        <div className="sheet p-4">
          <p className="mb-2">
            {account
              ? 'Finish connecting the payout account to receive transfers.'
              : 'Connect a payout account so Lightyard can pay your lab.'}
          </p>
          {onboard.error && <FormMessage kind="bad">{onboard.error.message}</FormMessage>}
          {isOwner ? (
            <button type="button" className="btn btn-primary" onClick={() => onboard.mutate()} disabled={onboard.isPending}>
              {account ? 'Continue onboarding' : 'Connect payout account'}
            </button>
          ) : (
            <p className="text-sm text-ink-soft">Only the lab owner connects the payout account.</p>
          )}
        </div>
      )}
      {months.length > 0 && (
        <Plot
          title="Transferred per month"
          x={months.map((_, i) => i + 1)}
          series={currencies.map((c) => ({
            label: c,
            values: months.map((m) => (monthly.find((x) => x.month === m && x.currency === c)?.cents ?? 0) / 100),
          }))}
          xLabel={`month (${months[0]} … ${months[months.length - 1]})`}
          yLabel="amount"
        />
      )}
      <div className="flex items-center justify-between">
        <h2 className="font-semibold">Transfers per order</h2>
        <button type="button" className="btn btn-quiet" onClick={() => download(transfers)} disabled={!transfers.length}>
          Export CSV
        </button>
      </div>
    </div>
  );
}

export default function PayoutsView(props: Props) {
  return (
    <QueryRoot>
      <View {...props} />
    </QueryRoot>
  );
}
