import { RoleChangeSchema } from '../../../../../../lib/schemas/labs';
import { requireRole } from '../../../../../../server/auth/guards';
import { readJson } from '../../../../../../server/http/body';
import { endpoint } from '../../../../../../server/http/endpoint';
import { grantRole } from '../../../../../../server/admin/roles';

export const POST = endpoint(async (ctx) => {
  const admin = requireRole(ctx, 'admin');
  const { role } = await readJson(ctx.request, RoleChangeSchema);
  await grantRole(admin, ctx.params.id!, role);
  return { ok: true };
});
