import type { ReactNode } from "react";

/**
 * The usual cautions where a step can hurt someone. They always end by deferring to the safety data
 * sheets, the site's own procedures and local codes: the tool reminds, it does not replace them.
 */
export function Cautions({ items, title = "Cautions" }: { items: readonly ReactNode[]; title?: string }) {
  return (
    <aside className="cautions" aria-label={title}>
      <p className="cautions-title">{title}</p>
      <ul>
        {items.map((item, i) => (
          <li key={i}>{item}</li>
        ))}
        <li>Follow the safety data sheets, the site&apos;s procedures and local codes; they govern.</li>
      </ul>
    </aside>
  );
}
