/**
 * The demo scenario: four invented labs in invented institutes, their people, a moderator and an admin.
 * Development only; every account uses DEMO_PASSWORD.
 */
import { sql } from 'drizzle-orm';
import { getDb } from './client';
import { users } from './schema';
import { buildLab, buildUser } from './factories';
import { seedListings } from './seed-listings';
import { seedListingFiles } from './seed-files';

export const DEMO_PASSWORD = 'demo-password-1';

export const DEMO_ACCOUNTS = {
  buyer: 'buyer@demo.lightyard.example',
  seller: 'seller@demo.lightyard.example',
  seller2: 'seller2@demo.lightyard.example',
  seller3: 'seller3@demo.lightyard.example',
  member: 'member@demo.lightyard.example',
  moderator: 'moderator@demo.lightyard.example',
  admin: 'admin@demo.lightyard.example',
} as const;

export async function isEmpty(): Promise<boolean> {
  const [row] = await getDb()
    .select({ n: sql<number>`count(*)` })
    .from(users);
  return (row?.n ?? 0) === 0;
}

/** `files: false` skips photos and measurement files (they need object storage, and tests rarely want them). */
export async function seedDemo(opts: { files?: boolean } = {}) {
  const password = DEMO_PASSWORD;
  const buyer = await buildUser({ email: DEMO_ACCOUNTS.buyer, name: 'Mireille Aubertin', password, roles: ['buyer'] });
  const seller = await buildUser({ email: DEMO_ACCOUNTS.seller, name: 'Ingrid Solvang', password, roles: ['buyer', 'seller'] });
  const seller2 = await buildUser({ email: DEMO_ACCOUNTS.seller2, name: 'Tobias Wendeborn', password, roles: ['buyer', 'seller'] });
  const seller3 = await buildUser({ email: DEMO_ACCOUNTS.seller3, name: 'Priya Ramaswaran', password, roles: ['buyer', 'seller'] });
  const member = await buildUser({ email: DEMO_ACCOUNTS.member, name: 'Jonas Reithmaier', password, roles: ['buyer', 'seller'] });
  const moderator = await buildUser({ email: DEMO_ACCOUNTS.moderator, name: 'Odalys Kerrigan', password, roles: ['moderator'] });
  const admin = await buildUser({ email: DEMO_ACCOUNTS.admin, name: 'Casimir Vantongeren', password, roles: ['admin', 'moderator'] });

  const labs = {
    cavity: await buildLab({
      name: 'Solvang Cavity QED Group',
      institute: 'Institute for Coherent Matter, Tarnholm University',
      country: 'NO',
      members: [
        { userId: seller.id, role: 'owner' },
        { userId: member.id, role: 'member' },
      ],
    }),
    squeezing: await buildLab({
      name: 'Quiet Light Laboratory',
      institute: 'Wendelstein Centre for Precision Interferometry',
      country: 'DE',
      members: [{ userId: seller2.id, role: 'owner' }],
    }),
    startup: await buildLab({
      name: 'Brightcount Photonics',
      institute: 'Brightcount Photonics Ltd (start-up)',
      country: 'GB',
      members: [{ userId: seller3.id, role: 'owner' }],
    }),
    buyerLab: await buildLab({
      name: 'Aubertin Atom Interferometry Team',
      institute: 'Lac-Sainte-Claire Institute of Physics',
      country: 'CA',
      members: [{ userId: buyer.id, role: 'owner' }],
    }),
  };
  const sellers = { cavity: seller.id, squeezing: seller2.id, startup: seller3.id };
  const listings = await seedListings({ cavity: labs.cavity.id, squeezing: labs.squeezing.id, startup: labs.startup.id }, sellers);
  if (opts.files !== false) await seedListingFiles(listings, sellers);
  return { users: { buyer, seller, seller2, seller3, member, moderator, admin }, labs, listings };
}
