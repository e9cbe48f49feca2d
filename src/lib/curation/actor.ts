import { HttpError } from '../http';
import type { Actor } from './types';

/** The signed-in user of a request as the actor of a change. */
export function actorFromLocals(locals: App.Locals): Actor {
  const u = locals.user;
  if (!u) throw new HttpError(401, 'unauthenticated', 'Sign in first, or send an API key');
  return { id: u.id, email: u.email, name: u.name, roles: u.roles };
}
