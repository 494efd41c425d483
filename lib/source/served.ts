/** A collector serves the sources on the collection route: those with a pickup interval. */
export function servedByCollectors(s: { pickupEveryDays: number | null }): boolean {
  return s.pickupEveryDays !== null;
}
