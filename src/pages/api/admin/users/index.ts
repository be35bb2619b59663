import { z } from 'zod';
import { requireRole } from '../../../../server/auth/guards';
import { readQuery } from '../../../../server/http/body';
import { endpoint } from '../../../../server/http/endpoint';
import { listUsers } from '../../../../server/admin/roles';

const QuerySchema = z.object({ q: z.string().max(100).optional() });

export const GET = endpoint(async (ctx) => {
  requireRole(ctx, 'admin');
  const { q } = readQuery(ctx.url, QuerySchema);
  return { users: await listUsers(q ?? '') };
});
