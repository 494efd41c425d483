import type { Metadata } from "next";
import { labelOf } from "@/lib/core/vocabulary";
import { listTraceChoices } from "@/lib/trace/trace.store";
import type { TraceChoices } from "@/lib/trace/trace.store";
import { traceBackwardReport, traceForwardReport } from "@/lib/trace/trace.service";
import { BACKWARD_KINDS, FORWARD_KINDS } from "@/lib/trace/trace-query.schema";
import type { DomainIssue } from "@/lib/core/result";
import { loadSite } from "@/app/_ui/site";
import { Empty, NoSite } from "@/app/_ui/ui";
import { BackwardResult } from "@/app/trace/backward-result";
import { ForwardResult } from "@/app/trace/forward-result";
import { toSiteInstant } from "@/app/trace/site-time";
import { canRead } from "@/lib/auth/read-matrix";
import { queryValue } from "@/app/_ui/links";
import type { SearchParams } from "@/app/_ui/links";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Trace" };

const KIND_WORDS: Readonly<Record<string, string>> = {
  PRODUCT_LOT: "Product lot",
  TANK: "Tank (at a time)",
  SHIPMENT: "Shipment (document no.)",
  BATCH: "Batch",
  SOURCE: "Source",
  PICKUP: "Pickup",
  LOT: "Feedstock lot",
};

export default async function TracePage({ searchParams }: { searchParams: Promise<SearchParams> }) {
  const { db, site, user } = await loadSite();
  if (!site) return <NoSite />;
  const sp = await searchParams;
  const dir = queryValue(sp.dir);
  const kind = queryValue(sp.kind);
  const code = queryValue(sp.code);
  const atLocal = queryValue(sp.at);
  const view = queryValue(sp.view) === "feedstock" ? "feedstock" : "all";
  const tz = site.timeZone;
  const choices = await listTraceChoices(db, site.id);
  const back =
    dir === "back" && code !== ""
      ? await traceBackwardReport(db, site.id, { kind, code, at: toSiteInstant(atLocal, tz) }, user.now)
      : null;
  const fwd =
    dir === "fwd" && code !== ""
      ? await traceForwardReport(db, site.id, { kind, code }, user.now, {
          withCustomers: canRead(user.role, "/customers"),
        })
      : null;
  return (
    <>
      <h1>Trace</h1>
      <p className="lede">
        Which feedstock went into a product lot, a tank, a shipment or a batch, and where the oil of a source, a pickup
        or a lot went. Masses come from replaying the movement ledger under each tank&apos;s mixing model, in whole
        grams.
      </p>
      <div className="trace-forms">
        <TraceForm
          legend="What is in it? (backward)"
          dir="back"
          kinds={BACKWARD_KINDS}
          kind={dir === "back" ? kind : "PRODUCT_LOT"}
          code={dir === "back" ? code : ""}
          atLocal={dir === "back" ? atLocal : ""}
          issues={back && !back.ok ? back.issues : []}
        />
        <TraceForm
          legend="Where did it go? (forward)"
          dir="fwd"
          kinds={FORWARD_KINDS}
          kind={dir === "fwd" ? kind : "LOT"}
          code={dir === "fwd" ? code : ""}
          atLocal=""
          issues={fwd && !fwd.ok ? fwd.issues : []}
        />
      </div>
      <ChoiceLists choices={choices} />
      {back?.ok ? <BackwardResult r={back.value} view={view} atLocal={atLocal} timeZone={tz} /> : null}
      {fwd?.ok ? <ForwardResult r={fwd.value} timeZone={tz} /> : null}
      {back === null && fwd === null ? <Empty>Choose what to trace above.</Empty> : null}
    </>
  );
}

function TraceForm({
  legend,
  dir,
  kinds,
  kind,
  code,
  atLocal,
  issues,
}: {
  legend: string;
  dir: "back" | "fwd";
  kinds: readonly string[];
  kind: string;
  code: string;
  atLocal: string;
  issues: DomainIssue[];
}) {
  const field = (name: string) => issues.find((i) => i.field === name);
  const general = issues.filter((i) => i.field !== "kind" && i.field !== "code" && i.field !== "at");
  return (
    <form method="get" action="/trace" className="trace-form" noValidate>
      <fieldset>
        <legend>{legend}</legend>
        <input type="hidden" name="dir" value={dir} />
        <label>
          Kind
          <select
            name="kind"
            defaultValue={kinds.includes(kind) ? kind : kinds[0]}
            aria-invalid={field("kind") ? true : undefined}
          >
            {kinds.map((k) => (
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
            defaultValue={code}
            required
            list={`choices-${dir}`}
            autoComplete="off"
            aria-invalid={field("code") ? true : undefined}
            aria-describedby={field("code") ? `${dir}-code-error` : undefined}
          />
        </label>
        {dir === "back" ? (
          <label>
            Tank time <span className="muted">(tanks only; site time)</span>
            <input
              name="at"
              type="datetime-local"
              defaultValue={atLocal}
              aria-invalid={field("at") ? true : undefined}
            />
          </label>
        ) : null}
        <button type="submit">{dir === "back" ? "Trace back" : "Trace forward"}</button>
        {["kind", "code", "at"].map((f) => {
          const issue = field(f);
          return issue ? (
            <p key={f} id={`${dir}-${f}-error`} className="form-error" role="alert">
              {issue.message}
            </p>
          ) : null;
        })}
        {general.map((i) => (
          <p key={i.code + i.message} className="form-error" role="alert">
            {i.message}
          </p>
        ))}
      </fieldset>
    </form>
  );
}

/** Suggestions for the code fields, newest first; any code can be typed. */
function ChoiceLists({ choices }: { choices: TraceChoices }) {
  const lists: Array<[string, string[]]> = [
    ["back", [...choices.productLots, ...choices.tanks, ...choices.shipments, ...choices.batches]],
    ["fwd", [...choices.lots, ...choices.sources, ...choices.pickups]],
  ];
  return (
    <>
      {lists.map(([k, codes]) => (
        <datalist key={k} id={`choices-${k}`}>
          {[...new Set(codes)].map((c) => (
            <option key={c} value={c} />
          ))}
        </datalist>
      ))}
    </>
  );
}
