import { RoleNameSchema } from '../../../../../../lib/schemas/labs';
import { requireRole } from '../../../../../../server/auth/guards';
import { parseWith } from '../../../../../../server/http/body';
import { endpoint } from '../../../../../../server/http/endpoint';
import { revokeRole } from '../../../../../../server/admin/roles';

export const DELETE = endpoint(async (ctx) => {
  const admin = requireRole(ctx, 'admin');
  const role = parseWith(RoleNameSchema, ctx.params.role);
  await revokeRole(admin, ctx.params.id!, role);
  return { ok: true };
});
