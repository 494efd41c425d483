import { gradesText } from "@/lib/spec/catalogue";
import type { CatalogueEdition, CatalogueProperty } from "@/lib/spec/catalogue";

/** A property's limits in an edition, each with the grades it applies to. */
export function GradeLimits({ property, edition }: { property: CatalogueProperty; edition: CatalogueEdition }) {
  return (
    <ul className="plain">
      {property.limits.map((l) => (
        <li key={l.text}>
          {l.text} <span className="muted">({gradesText(l.grades, edition)})</span>
        </li>
      ))}
    </ul>
  );
}
