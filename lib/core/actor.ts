/** Who is acting, where, and when (server clock) — passed into every service. */
export interface Actor {
  siteId: number;
  userId: number;
  now: Date;
}
