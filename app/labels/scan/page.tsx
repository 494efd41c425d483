import type { Metadata } from "next";
import { loadSite } from "@/app/_ui/site";
import { Scanner } from "@/app/labels/scan/scanner";

export const dynamic = "force-dynamic";
export const metadata: Metadata = { title: "Scan a label" };

export default async function ScanPage() {
  await loadSite();
  return (
    <>
      <h1>Scan a label</h1>
      <p className="lede">Point the camera at a lot or container label, or type the number printed on it.</p>
      <Scanner />
      <form method="get" action="/labels/find" className="sign-in">
        <label>
          Number on the label
          <input
            name="number"
            autoCapitalize="characters"
            autoComplete="off"
            required
            placeholder="e.g. L-0042, (10)L-0042, C-0012 or PU-00017"
          />
        </label>
        <button type="submit">Open the record</button>
      </form>
    </>
  );
}
