import Link from "next/link";
import type { Dashboard } from "@/app/_today/today";
import { day } from "@/app/_ui/format";
import { StatusMark } from "@/app/_ui/kit";
import { Empty, Note } from "@/app/_ui/ui";

/** The accounting period today falls in: its dates, and whether movements dated in it can still be booked. */
export function PeriodPanel({ d, tz, now }: { d: Dashboard; tz: string; now: Date }) {
  const p = d.currentPeriod;
  return (
    <section className="panel" aria-labelledby="period-h">
      <h2 id="period-h">Accounting period</h2>
      {p === null ? (
        <Empty>
          No accounting period covers today ({day(now, tz)}). <Link href="/periods">All periods</Link>
        </Empty>
      ) : (
        <>
          <p>
            {day(p.startsAt, tz)} to {day(new Date(p.endsAt.getTime() - 1), tz)}{" "}
            {p.status === "OPEN" ? (
              <StatusMark code="OPEN_PERIOD" label="Open" />
            ) : (
              <StatusMark code="CLOSED" label="Closed" />
            )}
          </p>
          <Note>
            {p.status === "OPEN"
              ? "Movements dated in this period can still be booked."
              : `Closed${p.closedBy ? ` by ${p.closedBy}` : ""}: movements dated in it are refused.`}{" "}
            <Link href="/periods">All periods</Link>
          </Note>
        </>
      )}
    </section>
  );
}

/** How many of each record the site holds, each a link to its list. */
export function Counts({ d }: { d: Dashboard }) {
  const counts: ReadonlyArray<readonly [string, string, number]> = [
    ["Sources", "/sources", d.counts.sources],
    [`Pickups in ${d.month.label}`, "/pickups", d.counts.pickupsThisMonth],
    ["Feedstock lots", "/lots", d.counts.lots],
    ["Batches", "/batches", d.counts.batches],
    ["Product lots", "/products", d.counts.productLots],
    ["Shipments", "/shipments", d.counts.shipments],
  ];
  return (
    <>
      <h2 id="counts">At a glance</h2>
      <dl className="counts" aria-labelledby="counts">
        {counts.map(([term, href, n]) => (
          <div key={href}>
            <dt>{term}</dt>
            <dd>
              <Link href={href}>{n}</Link>
            </dd>
          </div>
        ))}
      </dl>
    </>
  );
}
