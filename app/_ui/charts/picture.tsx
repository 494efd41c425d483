import type { ReactNode } from "react";
import "./picture.css";

/**
 * One picture: a heading, the drawing (read by screen readers as one image with a sentence of key
 * figures), the same sentence under it, and its numbers one click away.
 */
export function Picture({
  id,
  title,
  summary,
  svg,
  numbers,
  csvHref,
  wide = false,
}: {
  id: string;
  title: string;
  summary: string;
  svg: string;
  numbers: ReactNode;
  csvHref?: string;
  wide?: boolean;
}) {
  return (
    <figure className={wide ? "picture picture-wide" : "picture"} aria-labelledby={`${id}-title`} data-picture={id}>
      <h2 id={`${id}-title`} className="picture-title">
        {title}
      </h2>
      <div className="picture-drawing" role="img" aria-label={summary} dangerouslySetInnerHTML={{ __html: svg }} />
      <figcaption className="picture-summary">{summary}</figcaption>
      <details className="more-rows picture-numbers">
        <summary>The numbers behind this picture</summary>
        {numbers}
        {csvHref ? (
          <p>
            <a href={csvHref} download>
              Download as CSV
            </a>
          </p>
        ) : null}
      </details>
    </figure>
  );
}

/** Shown instead of a picture when there is nothing to draw yet. */
export function NoPicture({ id, title, children }: { id: string; title: string; children: ReactNode }) {
  return (
    <figure className="picture" aria-labelledby={`${id}-title`} data-picture={id}>
      <h2 id={`${id}-title`} className="picture-title">
        {title}
      </h2>
      <p className="empty">{children}</p>
    </figure>
  );
}
