import { ConfidenceMark, DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { describeEditions } from "@/lib/spec/catalogue";
import type { CatalogueEdition, CatalogueProperty } from "@/lib/spec/catalogue";
import { GradeLimits } from "@/app/_ui/grade-limits";

function columns(e: CatalogueEdition): Array<Column<CatalogueProperty>> {
  return [
    { key: "property", header: "Property", cell: (p) => p.label },
    { key: "method", header: "Test method", cell: (p) => p.method },
    {
      key: "limit",
      header: "Limit",
      cell: (p) => (p.limits.length === 1 ? p.limits[0]?.text : <GradeLimits property={p} edition={e} />),
    },
    {
      key: "note",
      header: "Note",
      cell: (p) => (p.notes.length ? p.notes.join(" ") : <span className="muted">—</span>),
    },
    { key: "confidence", header: "Source", cell: (p) => <ConfidenceMark level={p.confidence} anchor={p.anchor} /> },
  ];
}

/** Every built-in edition with its grades, each property's method and limit, and how far to rely on it. */
export function BuiltInEditions() {
  return (
    <>
      {describeEditions().map((e) => (
        <section key={e.key} className="spec-edition" aria-labelledby={`edition-${e.key}`}>
          <h3 id={`edition-${e.key}`}>
            {e.edition} — {e.title}
          </h3>
          <p>
            Grades:{" "}
            {e.grades.map((g) => g.grade + (g.note ? ` (${g.note.toLowerCase().replace(/\.$/, "")})` : "")).join(" · ")}
          </p>
          {e.rules.map((r) => (
            <p key={r.key}>
              <strong>{r.label}:</strong> {r.text}.
            </p>
          ))}
          <DataTable
            caption={`${e.edition} properties`}
            columns={columns(e)}
            rows={e.properties}
            rowKey={(p) => p.key}
            empty="No properties."
          />
        </section>
      ))}
    </>
  );
}
