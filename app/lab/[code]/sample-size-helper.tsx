"use client";
import { useState } from "react";
import { suggestSampleSize } from "@/lib/titration/sample-size";
import { formatFixed } from "@/lib/quantity/units";
import { toNumber } from "@/app/_ui/kit/form-state";

/** AOCS Ca 5a-40 Table 1: the sample and titrant for the FFA the analyst expects. */
export function SampleSizeHelper({ onUse }: { onUse: (sampleMassG: string, concentrationMolL: string) => void }) {
  const [expected, setExpected] = useState("");
  const expectedPct = toNumber(expected);
  const suggestion = expectedPct === undefined ? null : suggestSampleSize(expectedPct);
  return (
    <details className="sample-size">
      <summary>Sample size for the expected FFA</summary>
      <label>
        Expected FFA (%)
        <input inputMode="decimal" value={expected} onChange={(e) => setExpected(e.target.value)} />
      </label>
      {suggestion === null ? null : suggestion.ok ? (
        <p>
          Weigh {suggestion.value.row.sampleMassG} ± {suggestion.value.row.sampleToleranceG} g into{" "}
          {suggestion.value.row.alcoholMl} mL neutralised alcohol; titrate with{" "}
          {suggestion.value.row.concentrationsMolL.join(" or ")} mol/L (each mL ≈{" "}
          {suggestion.value.ffaPctPerMl.map((x) => formatFixed(x, 2)).join(" or ")} % FFA as oleic).{" "}
          <button
            type="button"
            className="secondary"
            onClick={() => {
              const row = suggestion.value.row;
              onUse(String(row.sampleMassG), String(row.concentrationsMolL[0] ?? ""));
            }}
          >
            Use this sample mass and concentration
          </button>
          <span className="note"> {suggestion.value.row.source}.</span>
        </p>
      ) : (
        <p className="warning">{suggestion.issues[0]?.message}</p>
      )}
    </details>
  );
}
