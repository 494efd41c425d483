import type { Metadata } from "next";
import Link from "next/link";
import { listRecordHistory, loadChain } from "@/lib/audit/audit.store";
import { verifyChain } from "@/lib/audit/chain";
import { describeChange, isRecordHistoryKind, RECORD_HISTORIES } from "@/lib/audit/history";
import type { RecordHistoryKind } from "@/lib/audit/history";
import { fieldWords, valueWords } from "@/lib/audit/field-words";
import type { HolderKind } from "@/lib/core/vocabulary";
import { when } from "@/app/_ui/format";
import { hrefOf } from "@/app/_ui/links";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite, Note } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Record history" };

type Search = Record<string, string | string[] | undefined>;
const one = (v: string | string[] | undefined): string => ((Array.isArray(v) ? v[0] : v) ?? "").trim();

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

/** Every recorded create, change, void, close and reopen of one record: who, when (UTC and site time), old and new values, reason. */
export default async function HistoryPage({ searchParams }: { searchParams: Promise<Search> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const kind = one(sp.kind);
  const key = one(sp.key);
  if (!isRecordHistoryKind(kind) || key === "") {
    return (
      <>
        <h1>Record history</h1>
        <p role="alert" className="form-error">
          Record kind: choose one of {Object.keys(RECORD_HISTORIES).join(", ")}, and give the record&apos;s code (key).
          Every list row has a History link.
        </p>
      </>
    );
  }
  if (kind === "user" && user.role !== "ADMIN" && key !== user.login) {
    return (
      <>
        <h1>Record history</h1>
        <p role="alert" className="form-error">
          Record kind: an account&apos;s history is shown to its owner and to administrators only.
        </p>
      </>
    );
  }
  const spec = RECORD_HISTORIES[kind];
  const [events, chain] = await Promise.all([
    listRecordHistory(db, site.id, spec.entities, key),
    loadChain(db, site.id),
  ]);
  const verified = verifyChain(chain);
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
      {verified.ok ? (
        <p className="status-line" role="status">
          <span className="status status-pass">chain intact</span> The site&apos;s audit trail checks out:{" "}
          {verified.value.events} events, each linked to the one before by its hash.
        </p>
      ) : (
        <p className="form-error" role="alert">
          The audit trail does not check out: {verified.issues[0]?.message}. Report this to the administrator; the
          stored history may have been altered outside the app.
        </p>
      )}
      {events.length === 0 ? (
        <Empty>
          Nothing recorded for {spec.label.toLowerCase()} {key} on this site.
        </Empty>
      ) : (
        <div className="table-wrap">
          <table className="history-table">
            <caption>
              {events.length} recorded event{events.length === 1 ? "" : "s"}
            </caption>
            <thead>
              <tr>
                <th scope="col" className="num">
                  No.
                </th>
                <th scope="col">When (site time)</th>
                <th scope="col">When (UTC)</th>
                <th scope="col">Who</th>
                <th scope="col">What</th>
                <th scope="col">Reason</th>
                <th scope="col">Values (before → after)</th>
              </tr>
            </thead>
            <tbody>
              {events.map((e) => {
                const changes = describeChange(e.before, e.after);
                return (
                  <tr key={e.seq}>
                    <td className="num">{e.seq}</td>
                    <td className="nowrap">{when(e.at, tz)}</td>
                    <td className="nowrap">{e.at.toISOString().replace(".000Z", "Z")}</td>
                    <td>
                      {e.actor} <span className="muted">({e.actorLogin})</span>
                    </td>
                    <td>
                      {ACTION_WORDS[e.action] ?? e.action} {ENTITY_WORDS[e.entity] ?? ""}
                      {e.intact ? null : (
                        <>
                          {" "}
                          <span className="status status-fail">hash does not match</span>
                        </>
                      )}
                    </td>
                    <td>{e.reason === "" ? <span className="muted">—</span> : e.reason}</td>
                    <td>
                      {changes.length === 0 ? (
                        <span className="muted">no values</span>
                      ) : (
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
                      )}
                    </td>
                  </tr>
                );
              })}
            </tbody>
          </table>
        </div>
      )}
      <Note>
        Times are the server&apos;s clock when the change was written. The hash of each event covers the one before it.
      </Note>
    </>
  );
}
