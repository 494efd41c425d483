import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { ConfidenceMark, DataTable, StatusMark } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { when } from "@/app/_ui/format";
import { chooseProductSpecAction, decideProductLotAction, recordQcResultAction } from "@/app/products/[code]/actions";
import type { CertificateData, CertificateRow } from "@/lib/product/certificate";
import type { QcView } from "@/lib/product/product.store";
import { formatResult } from "@/lib/product/certificate";
import { sourceAnchor } from "@/lib/spec/spec";
import type { Spec } from "@/lib/spec/spec";

/** Whether the lot could be released now, judged against its current specification. */
export function ReleaseCheck({ c }: { c: CertificateData }) {
  const lead =
    c.decision.status === "HELD"
      ? "Not ready to release."
      : c.decision.deviation
        ? "Released with a deviation; against the specification:"
        : "Against the current specification:";
  if (c.releasable) {
    return (
      <p className="release-check">
        <StatusMark code="PASS" label="Ready to release" /> Every required result is in and within limits, and every
        either-or requirement is met.
      </p>
    );
  }
  return (
    <div className="release-check">
      <p>
        <StatusMark
          code={c.failing.length > 0 ? "FAIL" : "MISSING"}
          label={c.failing.length > 0 ? "Out of specification" : "Results missing"}
        />{" "}
        {lead}
      </p>
      <ul>
        {c.failing.length > 0 ? <li>Out of limits: {c.failing.join(", ")}</li> : null}
        {c.missing.length > 0 ? (
          <li>
            Still missing ({c.missing.length}): {c.missing.join(", ")}
          </li>
        ) : null}
      </ul>
    </div>
  );
}

/** One row per property of the specification: limit, method, the result that counts and its verdict. */
export function SpecResults({ c, spec, timeZone }: { c: CertificateData; spec: Spec; timeZone: string }) {
  const confidence = new Map(spec.properties.map((p) => [p.key, p.confidence]));
  const columns: Array<Column<CertificateRow>> = [
    {
      key: "property",
      header: "Property",
      cell: (r) => (
        <>
          {r.property}
          {r.required ? null : <span className="muted"> (if needed)</span>}
          {confidence.get(r.key) === "check" ? (
            <>
              {" "}
              <ConfidenceMark level="check" anchor={sourceAnchor(spec.baseKey ?? spec.key, r.key)} />
            </>
          ) : null}
        </>
      ),
    },
    { key: "method", header: "Method", cell: (r) => r.method },
    { key: "limit", header: "Limit", cell: (r) => r.limit },
    {
      key: "result",
      header: "Result",
      numeric: true,
      cell: (r) => (r.result === "" ? <span className="muted">—</span> : r.result),
    },
    { key: "unit", header: "Unit", cell: (r) => r.unit },
    { key: "tested", header: "Tested", cell: (r) => (r.testedAt ? when(r.testedAt, timeZone) : "") },
    { key: "report", header: "Lab report", cell: (r) => [r.lab, r.reportNo].filter(Boolean).join(", ") },
    { key: "verdict", header: "Verdict", cell: (r) => <StatusMark code={r.verdict} label={r.verdictText} /> },
  ];
  return (
    <>
      <DataTable
        caption={`Results against ${c.specText}`}
        columns={columns}
        rows={c.rows}
        rowKey={(r) => r.key}
        empty="This specification lists no properties."
      />
      {c.rules.length > 0 ? (
        <ul className="rule-list" aria-label="Either-or requirements">
          {c.rules.map((r) => (
            <li key={r.label}>
              <StatusMark code={r.met ? "PASS" : "MISSING"} label={r.met ? "Met" : "Not met"} /> {r.label}: {r.text}
            </li>
          ))}
        </ul>
      ) : null}
    </>
  );
}

/** Every result ever entered, re-tests included; a replaced result is struck through and marked. */
export function ResultHistory({
  qc,
  labels,
  timeZone,
}: {
  qc: readonly QcView[];
  labels: ReadonlyMap<string, string>;
  timeZone: string;
}) {
  const struck = (q: QcView, text: string) => (q.supersededById === null ? text : <del>{text}</del>);
  const columns: Array<Column<QcView>> = [
    { key: "property", header: "Property", cell: (q) => struck(q, labels.get(q.property) ?? q.property) },
    { key: "value", header: "Result", numeric: true, cell: (q) => struck(q, formatResult(q.value)) },
    { key: "unit", header: "Unit", cell: (q) => q.unit },
    { key: "method", header: "Method", cell: (q) => q.method },
    { key: "spec", header: "Judged against", cell: (q) => q.specRef },
    {
      key: "verdict",
      header: "Verdict at entry",
      cell: (q) =>
        q.supersededById === null ? (
          <StatusMark code={q.verdict} />
        ) : (
          <StatusMark code="SUPERSEDED" label="Superseded by a re-test" />
        ),
    },
    { key: "tested", header: "Tested", cell: (q) => when(q.testedAt, timeZone) },
    { key: "lab", header: "Lab report", cell: (q) => [q.lab, q.reportNo].filter(Boolean).join(", ") },
    {
      key: "by",
      header: "Entered by",
      cell: (q) => [q.recordedBy ?? "", when(q.recordedAt, timeZone)].filter(Boolean).join(", "),
    },
  ];
  return (
    <DataTable
      caption="Every result entered"
      columns={columns}
      rows={[...qc].reverse()}
      rowKey={(q) => q.id}
      empty="No results entered yet."
    />
  );
}

export function QcEntryForm({
  code,
  spec,
  nextProperty,
  nowLocal,
}: {
  code: string;
  spec: Spec;
  nextProperty: string;
  nowLocal: string;
}) {
  const options = spec.properties.map((p) => [p.key, `${p.label}${p.unit ? ` (${p.unit})` : ""}`] as const);
  return (
    <ActionForm
      action={recordQcResultAction}
      submitLabel="Save result"
      label="Enter a QC result"
      hidden={{ productLotCode: code }}
      keepValues
    >
      <Field name="property" label="Property" type="select" options={options} defaultValue={nextProperty} />
      <Field
        name="value"
        label="Result"
        type="number"
        hint="In the unit shown beside the property; a class as its number (copper strip No. 1 → 1)."
      />
      <Field name="method" label="Test method" hint="Leave empty for the method the specification names." />
      <Field name="lab" label="Laboratory" />
      <Field name="reportNo" label="Lab report number" />
      <Field name="testedAt" label="Tested" type="datetime-local" defaultValue={nowLocal} />
    </ActionForm>
  );
}

export function SpecChoiceForm({
  code,
  current,
  choices,
}: {
  code: string;
  current: string;
  choices: ReadonlyArray<readonly [string, string]>;
}) {
  return (
    <ActionForm
      action={chooseProductSpecAction}
      submitLabel="Use this specification"
      label="Choose the specification"
      hidden={{ productLotCode: code }}
      keepValues
    >
      <Field
        name="specKey"
        label="Specification"
        type="select"
        options={choices}
        defaultValue={current}
        hint="Results already entered are judged again against the one chosen."
      />
    </ActionForm>
  );
}

export function DecisionForm({ code, status }: { code: string; status: string }) {
  const options: ReadonlyArray<readonly [string, string]> =
    status === "HELD"
      ? [
          ["RELEASE", "Release"],
          ["RELEASE_WITH_DEVIATION", "Release with a deviation (reason required)"],
          ["HOLD", "Keep on hold (reason required)"],
          ["REJECT", "Reject (reason required)"],
        ]
      : [["HOLD", "Put back on hold (reason required)"]];
  return (
    <ActionForm
      action={decideProductLotAction}
      submitLabel="Record decision"
      label="Release decision"
      hidden={{ productLotCode: code }}
    >
      <Field name="decision" label="Decision" type="select" options={options} />
      <Field
        name="reason"
        label="Reason"
        type="textarea"
        hint="Printed on the certificate for a deviation; kept in the record's history."
      />
    </ActionForm>
  );
}
