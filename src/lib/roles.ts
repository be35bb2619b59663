export const ROLE_NAMES = ['buyer', 'seller', 'moderator', 'admin'] as const;
export type RoleName = (typeof ROLE_NAMES)[number];

export const ROLE_LABELS: Record<RoleName, string> = {
  buyer: 'Buyer',
  seller: 'Seller',
  moderator: 'Moderator',
  admin: 'Admin',
};
