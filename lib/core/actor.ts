/** Who is acting, where, and when (server clock) — passed into every service. */
export interface Actor {
  siteId: number;
  userId: number;
  now: Date;
}

/** The acting part of a signed-in user (site, user, server clock), without the session's other fields. */
export function actorOf(who: Actor): Actor {
  return { siteId: who.siteId, userId: who.userId, now: who.now };
}
