import type { Metadata } from "next";
import Link from "next/link";
import { listRecordHistory, loadChain } from "@/lib/audit/audit.store";
import { verifyChain } from "@/lib/audit/chain";
import { describeChange, isRecordHistoryKind, RECORD_HISTORIES } from "@/lib/audit/history";
import type { RecordHistoryKind } from "@/lib/audit/history";
import { fieldWords, valueWords } from "@/lib/audit/field-words";
import type { HolderKind } from "@/lib/core/vocabulary";
import { when } from "@/app/_ui/format";
import { hrefOf, queryValue } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { NoSite, Note } from "@/app/_ui/ui";
import { DataTable, StatusMark } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import type { ReactNode } from "react";
import type { SearchParams } from "@/app/_ui/links";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Record history" };

const one = (v: string | string[] | undefined): string => queryValue(v).trim();

const ACTION_WORDS: Readonly<Record<string, string>> = {
  CREATE: "Recorded",
  CHANGE: "Changed",
  VOID: "Voided",
  CLOSE: "Closed",
  REOPEN: "Reopened",
  RELEASE: "Released",
  REJECT: "Rejected",
};

const ENTITY_WORDS: Readonly<Record<string, string>> = {
  FeedstockLot: "lot",
  Titration: "titration",
  LabTest: "lab test",
  TankGauge: "gauge reading",
  QcResult: "QC result",
  Movement: "movement",
};

/** The record's own page: the holder pages for holder-backed records, the list page for the rest. */
const HOLDER_OF: Partial<Record<RecordHistoryKind, HolderKind>> = {
  pickup: "PICKUP",
  lot: "LOT",
  tank: "TANK",
  batch: "BATCH",
  product: "PRODUCT_LOT",
  shipment: "SHIPMENT",
  waste: "WASTE_CONTAINER",
  disposal: "DISPOSAL",
};

function recordHref(kind: RecordHistoryKind, key: string): string | null {
  const holder = HOLDER_OF[kind];
  if (holder) return hrefOf(holder, key);
  if (kind === "source") return `/sources/${encodeURIComponent(key)}`;
  if (kind === "customer") return `/customers/${encodeURIComponent(key)}`;
  if (kind === "period") return "/periods";
  return null;
}

type HistoryEvent = Awaited<ReturnType<typeof listRecordHistory>>[number];

/** The page when the address names no history this user may read: the message names the field. */
function HistoryRefused({ children }: { children: ReactNode }) {
  return (
    <>
      <h1>Record history</h1>
      <p role="alert" className="form-error">
        {children}
      </p>
    </>
  );
}

function ChainCheck({ chain }: { chain: Awaited<ReturnType<typeof loadChain>> }) {
  const verified = verifyChain(chain);
  return verified.ok ? (
    <p className="status-line" role="status">
      <StatusMark code="PASS" label="chain intact" /> The site&apos;s audit trail checks out: {verified.value.events}{" "}
      events, each linked to the one before by its hash.
    </p>
  ) : (
    <p className="form-error" role="alert">
      The audit trail does not check out: {verified.issues[0]?.message}. Report this to the administrator; the stored
      history may have been altered outside the app.
    </p>
  );
}

/** The fields an event changed, each with its value before and after, folded away until asked for. */
function ChangeDetails({ e }: { e: HistoryEvent }) {
  const changes = describeChange(e.before, e.after);
  if (changes.length === 0) return <span className="muted">no values</span>;
  return (
    <details>
      <summary>
        {changes.length} field{changes.length === 1 ? "" : "s"}
      </summary>
      <table className="change-table">
        <tbody>
          {changes.map((c) => (
            <tr key={c.field}>
              <th scope="row">{fieldWords(c.field)}</th>
              <td>{valueWords(c.field, c.before) ?? <span className="muted">—</span>}</td>
              <td aria-hidden="true">→</td>
              <td>{valueWords(c.field, c.after) ?? <span className="muted">—</span>}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </details>
  );
}

function historyColumns(tz: string): Array<Column<HistoryEvent>> {
  return [
    { key: "seq", header: "No.", numeric: true, cell: (e) => e.seq },
    { key: "site", header: "When (site time)", cell: (e) => <span className="nowrap">{when(e.at, tz)}</span> },
    {
      key: "utc",
      header: "When (UTC)",
      cell: (e) => <span className="nowrap">{e.at.toISOString().replace(".000Z", "Z")}</span>,
    },
    {
      key: "who",
      header: "Who",
      cell: (e) => (
        <>
          {e.actor} <span className="muted">({e.actorLogin})</span>
        </>
      ),
    },
    {
      key: "what",
      header: "What",
      cell: (e) => (
        <>
          {ACTION_WORDS[e.action] ?? e.action} {ENTITY_WORDS[e.entity] ?? ""}
          {e.intact ? null : (
            <>
              {" "}
              <StatusMark code="FAIL" label="hash does not match" />
            </>
          )}
        </>
      ),
    },
    { key: "reason", header: "Reason", cell: (e) => (e.reason === "" ? <span className="muted">—</span> : e.reason) },
    { key: "values", header: "Values (before → after)", cell: (e) => <ChangeDetails e={e} /> },
  ];
}

/** Every recorded create, change, void, close and reopen of one record: who, when (UTC and site time), old and new values, reason. */
export default async function HistoryPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const kind = one(sp.kind);
  const key = one(sp.key);
  if (!isRecordHistoryKind(kind) || key === "") {
    return (
      <HistoryRefused>
        Record kind: choose one of {Object.keys(RECORD_HISTORIES).join(", ")}, and give the record&apos;s code (key).
        Every list row has a History link.
      </HistoryRefused>
    );
  }
  if (kind === "user" && user.role !== "ADMIN" && key !== user.login) {
    return (
      <HistoryRefused>
        Record kind: an account&apos;s history is shown to its owner and to administrators only.
      </HistoryRefused>
    );
  }
  const spec = RECORD_HISTORIES[kind];
  const [events, chain] = await Promise.all([
    listRecordHistory(db, site.id, spec.entities, key),
    loadChain(db, site.id),
  ]);
  const href = recordHref(kind, key);
  const tz = site.timeZone;
  return (
    <>
      <h1>
        History of {spec.label.toLowerCase()} {key}
      </h1>
      <p className="lede">
        Every change recorded for this record, oldest first, as written in the same transaction as the change. Records
        are never deleted; a mistake is voided or corrected with a reason.{" "}
        {href ? <Link href={href}>Open the record</Link> : null}
      </p>
      <ChainCheck chain={chain} />
      <DataTable
        caption={`${events.length} recorded event${events.length === 1 ? "" : "s"}`}
        className="history-table"
        columns={historyColumns(tz)}
        rows={events}
        rowKey={(e) => e.seq}
        empty={`Nothing recorded for ${spec.label.toLowerCase()} ${key} on this site.`}
      />
      <Note>
        Times are the server&apos;s clock when the change was written. The hash of each event covers the one before it.
      </Note>
    </>
  );
}
