import Link from "next/link";

/**
 * How far a default can be relied on, in two plain words, linking to the references page (/references) where the
 * published source and edition (or "common practice") of every default is listed.
 */
export function ConfidenceMark({ level, anchor }: { level: "published" | "check"; anchor: string }) {
  const text = level === "published" ? "published value" : "check before relying on it";
  return (
    <Link href={`/references#${encodeURIComponent(anchor)}`} className={`confidence confidence-${level}`}>
      {text}
    </Link>
  );
}
