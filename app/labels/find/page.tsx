import type { Metadata } from "next";
import Link from "next/link";
import { redirect } from "next/navigation";
import { readScanned } from "@/lib/labels/label-range";
import { findRecordByNumber } from "@/lib/labels/labels.store";
import { CODE_PATTERN } from "@/lib/core/fields";
import { loadSite } from "@/app/_ui/site";
import { NoSite } from "@/app/_ui/ui";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Find a label's record" };

/** A typed or scanned number → the record it names (lot, pickup or container), or a plain "not found". */
export default async function FindPage({ searchParams }: { searchParams: Promise<{ number?: string | string[] }> }) {
  const { db, site } = await loadSite();
  if (!site) return <NoSite />;
  const raw = (await searchParams).number;
  const typed = (Array.isArray(raw) ? raw[0] : raw) ?? "";
  const read = readScanned(typed, "http://invalid.invalid");
  const code = read && "code" in read ? read.code : "";
  const valid = CODE_PATTERN.test(code);
  const kind = valid ? await findRecordByNumber(db, site.id, code) : null;
  if (kind === "LOT") redirect(`/lots/${encodeURIComponent(code)}`);
  if (kind === "PICKUP") redirect(`/pickups/${encodeURIComponent(code)}`);
  if (kind === "CONTAINER") redirect(`/labels/container/${encodeURIComponent(code)}`);
  return (
    <>
      <h1>No record with that number</h1>
      <p className="form-error" role="alert">
        {typed.trim() === ""
          ? "Number on the label: type the number printed on it."
          : valid
            ? `Nothing at this site has the number ${code}.`
            : `Number on the label: ${typed.trim()} is not a lot, pickup or container number.`}
      </p>
      <form method="get" action="/labels/find" className="sign-in">
        <label>
          Number on the label
          <input name="number" defaultValue={typed} autoCapitalize="characters" autoComplete="off" required />
        </label>
        <button type="submit">Open the record</button>
      </form>
      <p>
        {valid ? (
          <>
            <Link href={`/labels/container/${encodeURIComponent(code)}`}>Open {code} as a new container label</Link>{" "}
            ·{" "}
          </>
        ) : null}
        <Link href="/labels/scan">Scan again</Link>
      </p>
    </>
  );
}
