import Link from "next/link";
import type { SourceLevel } from "@/lib/spec/source-text";

const LEVEL_TEXT: Readonly<Record<SourceLevel, string>> = {
  published: "published value",
  "common practice": "common practice",
  "site choice": "the site's own choice",
  check: "check before relying on it",
};

/**
 * How far a default can be relied on, in two plain words, linking to the references page (/references) where the
 * published source and edition (or "common practice") of every default is listed.
 */
export function ConfidenceMark({ level, anchor }: { level: SourceLevel; anchor: string }) {
  return (
    <Link
      href={`/references#${encodeURIComponent(anchor)}`}
      className={`confidence confidence-${level === "published" ? "published" : "check"}`}
    >
      {LEVEL_TEXT[level]}
    </Link>
  );
}
