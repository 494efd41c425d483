import type { Metadata } from "next";
import { listPeriods } from "@/lib/period/period.store";
import { listPeriodEvents } from "@/lib/mass-balance/balance.store";
import { PeriodActionForm } from "@/app/balance/period-form";
import { day, when } from "@/app/_ui/format";
import { loadSite } from "@/app/_ui/site";
import { Empty, HistoryLink, NoSite, Note } from "@/app/_ui/ui";
import type { Column } from "@/app/_ui/kit";
import { DataTable, StatusMark } from "@/app/_ui/kit";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Accounting periods" };

type PeriodRow = Awaited<ReturnType<typeof listPeriods>>[number];
type PeriodEvent = Awaited<ReturnType<typeof listPeriodEvents>>[number];

function periodColumns(tz: string, now: Date, canClose: boolean): Column<PeriodRow>[] {
  const month = (p: PeriodRow) => day(p.startsAt, tz).slice(0, 7);
  const columns: Column<PeriodRow>[] = [
    {
      key: "from",
      header: "From",
      cell: (p) => (
        <span className="nowrap">
          {day(p.startsAt, tz)}
          {p.startsAt <= now && now < p.endsAt ? <span className="tag">today</span> : null}
        </span>
      ),
    },
    {
      key: "to",
      header: "To (last day)",
      cell: (p) => <span className="nowrap">{day(new Date(p.endsAt.getTime() - 1), tz)}</span>,
    },
    {
      key: "status",
      header: "Status",
      cell: (p) =>
        p.status === "OPEN" ? (
          <StatusMark code="OPEN_PERIOD" label="Open" />
        ) : (
          <StatusMark code="CLOSED" label="Closed" />
        ),
    },
    {
      key: "last",
      header: "Last change",
      cell: (p) => (
        <span className="nowrap">
          {p.lastEvent ? `${p.lastEvent.action === "REOPEN" ? "Reopened" : "Closed"} ${when(p.lastEvent.at, tz)}` : "—"}
        </span>
      ),
    },
    { key: "by", header: "By", cell: (p) => p.lastEvent?.by ?? "—" },
    { key: "movements", header: "Movements", numeric: true, cell: (p) => p.movements },
    {
      key: "balance",
      header: "Balance",
      cell: (p) => (
        <a
          href={`/balance?${new URLSearchParams({ period: "CUSTOM", start: day(p.startsAt, tz), end: day(p.endsAt, tz) }).toString()}`}
        >
          balance
        </a>
      ),
    },
    {
      key: "history",
      header: "History",
      cell: (p) => (
        <HistoryLink kind="period" recordKey={String(p.id)} label={`accounting period ${month(p)}, record`} />
      ),
    },
  ];
  if (!canClose) return columns;
  return [
    ...columns,
    {
      key: "act",
      header: "Close or reopen",
      cell: (p) =>
        p.status === "CLOSED" ? (
          <PeriodActionForm periodId={p.id} action="reopen" periodLabel={month(p)} />
        ) : p.endsAt <= now ? (
          <PeriodActionForm periodId={p.id} action="close" periodLabel={month(p)} />
        ) : (
          <span className="muted">not ended yet</span>
        ),
    },
  ];
}

const eventColumns = (tz: string): Column<PeriodEvent>[] => [
  { key: "when", header: "When", cell: (e) => <span className="nowrap">{when(e.at, tz)}</span> },
  { key: "period", header: "Period", cell: (e) => <span className="nowrap">{day(e.periodStartsAt, tz)}</span> },
  { key: "action", header: "Action", cell: (e) => (e.action === "CLOSE" ? "Closed" : "Reopened") },
  { key: "by", header: "By", cell: (e) => e.by },
  { key: "reason", header: "Reason", cell: (e) => e.reason },
];

export default async function PeriodsPage() {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const [periods, events] = await Promise.all([listPeriods(db, site.id), listPeriodEvents(db, site.id, { take: 20 })]);
  const canClose = user.role === "COMPLIANCE";
  const now = new Date();
  const tz = site.timeZone;
  return (
    <>
      <h1>Accounting periods</h1>
      <p className="lede">
        The periods the books are balanced and closed by. Once a period is closed, no movement dated inside it can be
        booked until a compliance user reopens it.
      </p>
      {periods.length === 0 ? (
        <Empty>No accounting periods recorded yet.</Empty>
      ) : (
        <>
          <DataTable
            caption="Accounting periods"
            hideCaption
            columns={periodColumns(tz, now, canClose)}
            rows={periods}
            rowKey={(p) => p.id}
            empty="No accounting periods recorded yet."
          />
          <Note>
            A period runs from the start of its first day up to, not including, the start of the day after its last day.
          </Note>
          <h2>Closes and reopens</h2>
          <DataTable
            caption="Closes and reopens"
            hideCaption
            columns={eventColumns(tz)}
            rows={events}
            rowKey={(e) => e.id}
            empty="No period has been closed or reopened yet."
          />
        </>
      )}
    </>
  );
}
