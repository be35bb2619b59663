import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

function Ask({ listingId, what }: { listingId: string; what: 'question' | 'report' }) {
  const [text, setText] = useState('');
  const m = useMutation<{ threadId?: string }, ApiError>({
    mutationFn: () =>
      api(`/api/listings/${listingId}/${what === 'question' ? 'questions' : 'reports'}`, {
        body: what === 'question' ? { body: text } : { reason: text },
      }),
    onSuccess: () => setText(''),
  });
  const id = `${what}-${listingId}`;
  return (
    <div>
      {m.isSuccess &&
        (what === 'question' ? (
          <FormMessage kind="good">
            Sent to the lab. <a href={`/messages/${m.data.threadId}`}>Open the conversation</a>
          </FormMessage>
        ) : (
          <FormMessage kind="good">Thank you. A moderator will look at it.</FormMessage>
        ))}
      {m.error && <FormMessage kind="bad">{m.error.fields?.body ?? m.error.fields?.reason ?? m.error.message}</FormMessage>}
      <label htmlFor={id} className="field-label">
        {what === 'question' ? 'Your question to the lab' : 'What is wrong with this listing?'}
      </label>
      <textarea id={id} className="field-input min-h-20" value={text} onChange={(e) => setText(e.target.value)} />
      <button type="button" className="btn btn-quiet mt-2" disabled={m.isPending || text.trim().length < 2} onClick={() => m.mutate()}>
        {what === 'question' ? 'Send question' : 'Send report'}
      </button>
    </div>
  );
}

export default function AskSeller(props: { listingId: string; what: 'question' | 'report' }) {
  return (
    <QueryRoot>
      <Ask {...props} />
    </QueryRoot>
  );
}
