import { useMutation } from '@tanstack/react-query';
import { useState } from 'react';
import { api, type ApiError } from '../../lib/api-client';
import { FormMessage } from '../forms/Field';
import { QueryRoot } from '../forms/QueryRoot';

function Reply({ threadId }: { threadId: string }) {
  const [text, setText] = useState('');
  const m = useMutation<unknown, ApiError>({
    mutationFn: () => api(`/api/threads/${threadId}/messages`, { body: { body: text } }),
    onSuccess: () => window.location.reload(),
  });
  return (
    <div>
      {m.error && <FormMessage kind="bad">{m.error.fields?.body ?? m.error.message}</FormMessage>}
      <label htmlFor="reply" className="field-label">
        Reply
      </label>
      <textarea id="reply" className="field-input min-h-24" value={text} onChange={(e) => setText(e.target.value)} />
      <button type="button" className="btn btn-primary mt-2" disabled={m.isPending || text.trim().length < 2} onClick={() => m.mutate()}>
        Send
      </button>
    </div>
  );
}

export default function ThreadReply(props: { threadId: string }) {
  return (
    <QueryRoot>
      <Reply {...props} />
    </QueryRoot>
  );
}
