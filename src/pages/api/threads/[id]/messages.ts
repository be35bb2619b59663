import { QuestionSchema } from '../../../../lib/schemas/listings';
import { requireUser } from '../../../../server/auth/guards';
import { readJson } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { jsonResponse } from '../../../../server/http/errors';
import { reply, requireThreadParticipant, threadMessages } from '../../../../server/listings/messages';

export const GET = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  await requireThreadParticipant(user, ctx.params.id!);
  return { messages: await threadMessages(ctx.params.id!) };
});

export const POST = endpoint(async (ctx) => {
  const user = requireUser(ctx);
  const { body } = await readJson(ctx.request, QuestionSchema);
  return jsonResponse(await reply(user, ctx.params.id!, body), 201);
});
