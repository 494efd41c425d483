import type { Metadata } from "next";
import Link from "next/link";
import { DataTable } from "@/app/_ui/kit";
import type { Column } from "@/app/_ui/kit";
import { loadSite } from "@/app/_ui/site";
import { describeEditions } from "@/lib/spec/catalogue";
import type { CatalogueEdition, CatalogueProperty } from "@/lib/spec/catalogue";
import { balanceDefaults, recipeDefaults, screeningDefaults, wasteDefaults } from "@/app/references/default-sources";
import type { DefaultGroup, DefaultSource, SourceLevel } from "@/app/references/default-sources";
import { LOCAL_RULES_NOTE } from "@/lib/waste/waste-due";
import { GradeLimits } from "@/app/_ui/grade-limits";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "References" };

const LEVEL_TEXT: Readonly<Record<SourceLevel, string>> = {
  published: "published value",
  "common practice": "common practice",
  "site choice": "the site's own choice",
  check: "check before relying on it",
};

function Level({ level }: { level: SourceLevel }) {
  return (
    <span className={`confidence confidence-${level === "published" ? "published" : "check"}`}>
      {LEVEL_TEXT[level]}
    </span>
  );
}

function specColumns(e: CatalogueEdition): Array<Column<CatalogueProperty>> {
  return [
    {
      key: "property",
      header: "Property",
      cell: (p) => (
        <span id={p.anchor} className="anchor-target">
          {p.label}
        </span>
      ),
    },
    {
      key: "limit",
      header: "Limit",
      cell: (p) => <GradeLimits property={p} edition={e} />,
    },
    { key: "method", header: "Test method", cell: (p) => p.method },
    { key: "source", header: "Published source", cell: (p) => p.sources.join("; ") },
    {
      key: "level",
      header: "Reliance",
      cell: (p) =>
        p.confidence === "published" ? (
          <Level level="published" />
        ) : (
          <>
            <Level level="check" />
            <div className="muted method-line">Confirm against the purchased standard.</div>
          </>
        ),
    },
  ];
}

const DEFAULT_COLUMNS: Array<Column<DefaultSource>> = [
  {
    key: "setting",
    header: "Setting",
    cell: (d) => (
      <span id={d.anchor} className="anchor-target">
        {d.label}
      </span>
    ),
  },
  { key: "value", header: "Default", cell: (d) => d.value },
  { key: "source", header: "Source", cell: (d) => d.source },
  { key: "level", header: "Reliance", cell: (d) => <Level level={d.level} /> },
];

function Defaults({ group, note }: { group: DefaultGroup; note?: string }) {
  return (
    <section aria-labelledby={`group-${group.key}`}>
      <h3 id={`group-${group.key}`}>{group.title}</h3>
      {group.edition ? <p className="muted">Edition: {group.edition}</p> : null}
      {note ? <p>{note}</p> : null}
      <DataTable
        caption={group.title}
        hideCaption
        columns={DEFAULT_COLUMNS}
        rows={group.entries}
        rowKey={(d) => d.anchor}
        empty="No defaults."
      />
    </section>
  );
}

/**
 * Where every built-in limit and default comes from: the published source and edition, or "common
 * practice", or a plain warning to check it. The marks beside limits and defaults elsewhere link here.
 */
export default async function ReferencesPage() {
  await loadSite();
  return (
    <>
      <h1>References</h1>
      <p className="lede">
        Where each built-in limit and default comes from. A value marked &ldquo;check before relying on it&rdquo; could
        not be confirmed in the current published text; confirm it against your copy of the standard or rule before
        relying on it. Every default can be changed by the site (specifications:{" "}
        <Link href="/specs">site specifications</Link>).
      </p>

      <h2>Specification limits</h2>
      {describeEditions().map((e) => (
        <section key={e.key} aria-labelledby={`ref-${e.key}`}>
          <h3 id={`ref-${e.key}`}>
            {e.edition} — {e.title}
          </h3>
          {e.rules.map((r) => (
            <p key={r.key} id={`${e.key}-${r.key}`} className="anchor-target">
              <strong>{r.label}:</strong> {r.text} ({r.source}).
            </p>
          ))}
          <DataTable
            caption={`${e.edition} limits and their sources`}
            hideCaption
            columns={specColumns(e)}
            rows={e.properties}
            rowKey={(p) => p.key}
            empty="No properties."
          />
        </section>
      ))}

      <h2>Waste rule defaults</h2>
      <Defaults group={wasteDefaults()} note={LOCAL_RULES_NOTE} />

      <h2>Recipe defaults</h2>
      <Defaults group={recipeDefaults()} />

      <h2>Mass-balance closure tolerance</h2>
      <Defaults
        group={balanceDefaults()}
        note="A site works to its own tolerance, set on its limits page; this is where it starts."
      />

      <h2>Source check defaults</h2>
      <Defaults
        group={screeningDefaults()}
        note="No standard defines implausible used cooking oil: where the trade publishes no threshold the value is our own choice and says so."
      />
    </>
  );
}
