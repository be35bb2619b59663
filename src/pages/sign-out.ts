import type { APIRoute } from 'astro';
import { endSession } from '../server/auth/session';

/** The account menu's sign-out form (works without JavaScript); the origin check refuses cross-site posts. */
export const POST: APIRoute = async ({ cookies, locals, redirect }) => {
  await endSession(cookies, locals.session?.id);
  return redirect('/', 303);
};
