import type { Metadata } from "next";
import Link from "next/link";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite, Note } from "@/app/_ui/ui";
import { ReportDownloads, ReportHeader, ReportTableView } from "@/app/_ui/report-view";
import { holdRecalledAction } from "@/app/trace/recall/actions";
import { readRecallSearch, recallInput, recallQueryString } from "@/app/trace/recall/query";
import type { RecallSearch } from "@/app/trace/recall/query";
import { canRead } from "@/lib/auth/read-matrix";
import type { DomainIssue } from "@/lib/core/result";
import { labelOf } from "@/lib/core/vocabulary";
import { DECISION_REASON_MAX } from "@/lib/product/product.schema";
import type { ReportDoc } from "@/lib/report/report";
import { buildRecallDoc } from "@/lib/trace/recall-report";
import { RECALL_KINDS } from "@/lib/trace/recall.schema";
import { recallReportCached } from "@/lib/trace/recall-cache.service";
import type { RecallReport } from "@/lib/trace/recall";
import type { SearchParams } from "@/app/_ui/links";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Recall" };

const KIND_WORDS: Readonly<Record<string, string>> = {
  SOURCE: "Source (its pickups and deliveries)",
  PICKUP: "Pickup",
  LOT: "Feedstock lot",
  TANK: "Tank (what went into it)",
  BATCH: "Batch",
  PRODUCT_LOT: "Product lot",
};

export default async function RecallPage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const s = readRecallSearch((k) => {
    const v = sp[k];
    return Array.isArray(v) ? v[0] : v;
  });
  const withCustomers = canRead(user.role, "/customers");
  const input = recallInput(s, site.timeZone);
  const r = s.code === "" ? null : await recallReportCached(db, site.id, input, user.now, { withCustomers });
  const doc = r?.ok
    ? buildRecallDoc(
        r.value,
        {
          plant: `${site.name}, ${site.town}`,
          producedAt: user.now,
          producedBy: user.fullName,
          timeZone: site.timeZone,
        },
        { withCustomers },
      )
    : null;
  return (
    <>
      <h1>Recall</h1>
      <p className="lede">
        Where the material of a source, a pickup, a lot, a tank, a batch or a product lot went: every product lot,
        shipment and customer it reached, and what is still on site to hold. For a source or a tank, limit it to the
        days the material came in.
      </p>
      <RecallForm s={s} issues={r && !r.ok ? r.issues : []} />
      {r?.ok && doc ? (
        <RecallResult
          r={r.value}
          doc={doc}
          s={s}
          input={input}
          canHold={user.role === "COMPLIANCE"}
          withCustomers={withCustomers}
        />
      ) : null}
      {r === null ? <Empty>Choose where to start above.</Empty> : null}
    </>
  );
}

function RecallForm({ s, issues }: { s: RecallSearch; issues: DomainIssue[] }) {
  const field = (name: string) => issues.find((i) => i.field === name);
  const known = ["kind", "code", "from", "to"];
  return (
    <form method="get" action="/trace/recall" className="trace-form" noValidate>
      <fieldset>
        <legend>Follow it forward</legend>
        <label>
          Start from
          <select name="kind" defaultValue={(RECALL_KINDS as readonly string[]).includes(s.kind) ? s.kind : "SOURCE"}>
            {RECALL_KINDS.map((k) => (
              <option key={k} value={k}>
                {KIND_WORDS[k] ?? labelOf(k)}
              </option>
            ))}
          </select>
        </label>
        <label>
          Code
          <input
            name="code"
            defaultValue={s.code}
            required
            autoComplete="off"
            aria-invalid={field("code") ? true : undefined}
          />
        </label>
        <label>
          From <span className="muted">(first day, site time)</span>
          <input name="from" type="date" defaultValue={s.from} aria-invalid={field("from") ? true : undefined} />
        </label>
        <label>
          To <span className="muted">(last day, included)</span>
          <input name="to" type="date" defaultValue={s.to} aria-invalid={field("to") ? true : undefined} />
        </label>
        <button type="submit">Find where it went</button>
        {known.map((f) => {
          const issue = field(f);
          return issue ? (
            <p key={f} className="form-error" role="alert">
              {issue.message}
            </p>
          ) : null;
        })}
        {issues
          .filter((i) => i.field === undefined || !known.includes(i.field))
          .map((i) => (
            <p key={i.code + i.message} className="form-error" role="alert">
              {i.message}
            </p>
          ))}
      </fieldset>
    </form>
  );
}

function RecallResult({
  r,
  doc,
  s,
  input,
  canHold,
  withCustomers,
}: {
  r: RecallReport;
  doc: ReportDoc;
  s: RecallSearch;
  input: { from: string | undefined; to: string | undefined };
  canHold: boolean;
  withCustomers: boolean;
}) {
  const qs = recallQueryString({ ...s, kind: r.query.kind, code: r.query.code });
  const href = (format: "pdf" | "csv", table?: string) =>
    `/trace/recall/report?${qs}&format=${format}${table ? `&table=${table}` : ""}`;
  const tables = new Map(doc.tables.map((t) => [t.key, t]));
  return (
    <section aria-labelledby="recall-h" className="trace-result">
      <h2 id="recall-h">Where it went: {doc.subject}</h2>
      <ReportHeader doc={doc} />
      <ReportDownloads doc={doc} href={href} />
      {r.tracedG === 0 ? (
        <Empty>No material of it moved in {r.query.from || r.query.to ? "within these days" : "yet"}.</Empty>
      ) : (
        <>
          {withCustomers ? null : <Note>Customers are shown to compliance and administrators.</Note>}
          {[...tables.values()].map((t) => (
            <ReportTableView key={t.key} doc={doc} table={t} csvHref={href("csv", t.key)} />
          ))}
          <section aria-labelledby="hold-h">
            <h3 id="hold-h">Hold what is on site</h3>
            {r.toHold.length === 0 ? (
              <Empty>No product lot on site holds any of this material.</Empty>
            ) : canHold ? (
              <>
                <p className="lede">
                  Puts {r.toHold.length === 1 ? "this product lot" : `these ${r.toHold.length} product lots`} on hold
                  with your reason, all together or none: {r.toHold.join(", ")}. Each lot keeps the reason in its
                  history; released lots cannot be shipped until released again. Tanks holding some of it are listed
                  above; hold them by your site procedure.
                </p>
                <ActionForm
                  action={holdRecalledAction}
                  submitLabel={`Put ${r.toHold.length} product lot${r.toHold.length === 1 ? "" : "s"} on hold`}
                  label="Hold the product lots reached"
                  hidden={{ kind: r.query.kind, code: r.query.code, from: input.from ?? "", to: input.to ?? "" }}
                >
                  <Field
                    name="reason"
                    label="Reason"
                    type="textarea"
                    required
                    maxLength={DECISION_REASON_MAX}
                    hint="For example the complaint or notice this recall answers."
                  />
                </ActionForm>
              </>
            ) : (
              <Note>
                Product lots to hold: {r.toHold.join(", ")}. A compliance user puts them on hold from this page.{" "}
                <Link href="/products">Product lots</Link>
              </Note>
            )}
          </section>
        </>
      )}
    </section>
  );
}
