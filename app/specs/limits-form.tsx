import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { limitText } from "@/lib/spec/spec";
import type { Spec, SpecProperty } from "@/lib/spec/spec";
import { limitsOf } from "@/lib/spec/site-spec";
import { saveSiteSpecAction } from "@/app/specs/actions";

function shown(n: number | null): string {
  return n === null ? "" : String(n);
}

/** Each property, its published limit, and the site's lower and upper limits as fields prefilled to change. */
function limitColumns(base: Spec): Array<Column<SpecProperty>> {
  const published = (p: SpecProperty) => base.properties.find((q) => q.key === p.key) ?? p;
  return [
    {
      key: "property",
      header: "Property",
      cell: (p) => (
        <>
          {p.label}
          <div className="muted method-line">{p.method}</div>
        </>
      ),
    },
    { key: "published", header: `${base.edition} ${base.grade}`, cell: (p) => limitText(published(p)) },
    {
      key: "min",
      header: "Site lower limit",
      cell: (p) =>
        p.kind === "class" ? (
          <span className="muted">—</span>
        ) : (
          <Field
            name={`min.${p.key}`}
            label={`${p.label}, lower limit`}
            unit={p.unit || undefined}
            type="number"
            defaultValue={shown(limitsOf(p).min)}
          />
        ),
    },
    {
      key: "max",
      header: "Site upper limit",
      cell: (p) => (
        <Field
          name={`max.${p.key}`}
          label={p.kind === "class" ? `${p.label}, worst class accepted` : `${p.label}, upper limit`}
          unit={p.unit || undefined}
          type="number"
          defaultValue={shown(limitsOf(p).max)}
        />
      ),
    },
  ];
}

/**
 * The form that writes a site specification version: every property of the spec it starts from, its
 * published limit beside it, and the site's lower and upper limits prefilled to change.
 */
export function LimitsForm({
  base,
  start,
  name,
  previousVersion,
  customerId,
  customers,
  submitLabel,
}: {
  base: Spec;
  start: Spec;
  name?: string;
  previousVersion?: number;
  /** A new version keeps the customer of the version it starts from. */
  customerId?: number | null;
  customers: ReadonlyArray<{ id: number; code: string; name: string }>;
  submitLabel: string;
}) {
  const hidden: Record<string, string> = { baseKey: base.key };
  if (name !== undefined) hidden.name = name;
  if (previousVersion !== undefined) hidden.previousVersion = String(previousVersion);
  if (customerId != null) hidden.customerId = String(customerId);
  return (
    <ActionForm
      action={saveSiteSpecAction}
      submitLabel={submitLabel}
      hidden={hidden}
      label={name === undefined ? "New site specification" : `New version of ${name}`}
    >
      {name === undefined ? (
        <Field
          name="name"
          label="Name"
          required
          hint="How staff and certificates will call it, e.g. the buyer's name and what differs."
        />
      ) : null}
      {customers.length > 0 && name === undefined ? (
        <Field
          name="customerId"
          label="For customer"
          type="select"
          options={[["", "Any customer"], ...customers.map((c) => [String(c.id), `${c.name} (${c.code})`] as const)]}
        />
      ) : null}
      <div className="field-wide limit-fields">
        <DataTable
          caption="Limits"
          columns={limitColumns(base)}
          rows={start.properties}
          rowKey={(p) => p.key}
          empty="This grade has no properties."
        />
        <p className="field-hint">
          A site limit may be tighter than the published one, never looser. Leave both limits empty for a property that
          is only reported.
        </p>
      </div>
      <div className="field-wide">
        <Field
          name="reason"
          label="Reason"
          type="textarea"
          required
          hint="Why the site needs these limits, e.g. the buyer's contract clause."
        />
      </div>
    </ActionForm>
  );
}
