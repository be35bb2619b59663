import { SignUpSchema } from '../../../lib/schemas/auth';
import { signUp } from '../../../server/auth/accounts';
import { readJson } from '../../../server/http/body';
import { endpoint } from '../../../server/http/endpoint';
import { jsonResponse } from '../../../server/http/errors';

export const POST = endpoint(async ({ request }) => {
  const input = await readJson(request, SignUpSchema);
  const user = await signUp(input);
  return jsonResponse({ user, next: 'Check your inbox for the confirmation link.' }, 201);
});
