// The built-in editions as a reader sees them: each property once per edition, with its limit per
// grade, method, source and how far it can be relied on. Used by the specifications and sources pages.
import { EDITION_TABLES } from "@/lib/spec/editions";
import { limitText, ruleText, sourceAnchor, listBuiltInSpecs } from "@/lib/spec/spec";
import type { SpecProperty } from "@/lib/spec/spec";

export interface CatalogueProperty {
  key: string;
  anchor: string;
  label: string;
  method: string;
  unit: string;
  /** One entry per distinct limit: which grades it applies to and the limit as written. */
  limits: Array<{ grades: string[]; text: string }>;
  confidence: "published" | "check";
  sources: string[];
  notes: string[];
}

export interface CatalogueEdition {
  key: string;
  edition: string;
  title: string;
  grades: Array<{ key: string; grade: string; note?: string }>;
  properties: CatalogueProperty[];
  rules: Array<{ key: string; label: string; text: string; source: string }>;
}

function merge(into: CatalogueProperty, p: SpecProperty, grade: string): void {
  const text = limitText(p);
  const same = into.limits.find((l) => l.text === text);
  if (same) same.grades.push(grade);
  else into.limits.push({ grades: [grade], text });
  if (p.confidence === "check") into.confidence = "check";
  if (p.source !== undefined && !into.sources.includes(p.source)) into.sources.push(p.source);
  if (p.note !== undefined && !into.notes.includes(p.note)) into.notes.push(p.note);
}

export function describeEditions(): CatalogueEdition[] {
  const specs = listBuiltInSpecs();
  return EDITION_TABLES.map((t) => {
    const props = new Map<string, CatalogueProperty>();
    for (const s of specs.filter((x) => x.key.startsWith(`${t.key}/`))) {
      for (const p of s.properties) {
        let entry = props.get(p.key);
        if (entry === undefined) {
          entry = {
            key: p.key,
            anchor: sourceAnchor(s.key, p.key),
            label: p.label,
            method: p.method,
            unit: p.unit,
            limits: [],
            confidence: p.confidence,
            sources: [],
            notes: [],
          };
          props.set(p.key, entry);
        }
        merge(entry, p, s.grade);
      }
    }
    const first = specs.find((x) => x.key.startsWith(`${t.key}/`));
    const rules = t.rules.map((r) => ({
      key: r.key,
      label: r.label,
      text: first ? ruleText(first, { key: r.key, label: r.label, anyOf: r.anyOf }) : r.label,
      source: r.source,
    }));
    return {
      key: t.key,
      edition: t.edition,
      title: t.title,
      grades: t.grades.map((g) => ({ ...g })),
      properties: [...props.values()],
      rules,
    };
  });
}

/** "all grades" when a limit applies to every grade of the edition, else the grades by name. */
export function gradesText(grades: readonly string[], edition: CatalogueEdition): string {
  return grades.length === edition.grades.length ? "all grades" : grades.join(", ");
}
