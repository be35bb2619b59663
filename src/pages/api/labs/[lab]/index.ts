import { requireLabMember } from '../../../../server/auth/guards';
import { endpoint } from '../../../../server/http/endpoint';
import { labMembers, pendingInvites } from '../../../../server/labs/labs';

export const GET = endpoint(async (ctx) => {
  const { lab, role } = await requireLabMember(ctx, ctx.params.lab!);
  const [members, invites] = await Promise.all([labMembers(lab.id), role === 'owner' ? pendingInvites(lab.id) : []]);
  return { lab: { id: lab.id, slug: lab.slug, name: lab.name, institute: lab.institute, country: lab.country }, role, members, invites };
});
