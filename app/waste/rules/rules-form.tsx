"use client";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { chooseWasteRulesAction } from "@/app/waste/actions";

const CATEGORIES: ReadonlyArray<readonly [string, string]> = [
  ["LQG", "Large quantity generator (40 CFR 262.17)"],
  ["SQG", "Small quantity generator (40 CFR 262.16)"],
  ["VSQG", "Very small quantity generator (40 CFR 262.14)"],
];

/** Federal rules as written, or the site's own named set with the limits it replaces and why. */
export function WasteRulesForm({ current }: { current: { choice: string; generatorCategory: string } }) {
  return (
    <ActionForm action={chooseWasteRulesAction} submitLabel="Save the rule set" label="Choose the waste rule set">
      <Field
        name="choice"
        label="Rule set"
        type="select"
        defaultValue={current.choice}
        options={[
          ["US_FEDERAL", "US federal generator rules as written"],
          ["SITE_OWN", "The site's own rule set (state or other country)"],
        ]}
        required
      />
      <Field
        name="generatorCategory"
        label="Generator category"
        type="select"
        defaultValue={current.generatorCategory}
        options={CATEGORIES}
        required
      />
      <Field
        name="tsdfDistanceMiles"
        label="Distance to the treatment facility"
        unit="miles"
        type="number"
        hint="Only for a small quantity generator: 200 miles or more allows 270 days (40 CFR 262.16)"
      />
      <Field
        name="name"
        label="Name of the site's own rule set"
        hint="For example the state or national rule it follows; leave empty for federal rules"
      />
      <Field
        name="hazardousMaxDays"
        label="Longest accumulation of hazardous waste"
        unit="days"
        type="number"
        hint="Own rule set only; empty keeps the federal value"
      />
      <Field
        name="nonHazardousMaxDays"
        label="Longest storage of non-hazardous waste"
        unit="days"
        type="number"
        hint="Own rule set only; no federal limit applies"
      />
      <Field
        name="satelliteMaxUsGal"
        label="Satellite area limit"
        unit="US gal"
        type="number"
        hint="Own rule set only"
      />
      <Field
        name="satelliteExcessDays"
        label="Days to move a satellite excess"
        unit="days"
        type="number"
        hint="Own rule set only"
      />
      <Field
        name="reason"
        label="Reason"
        type="textarea"
        hint="Why the site works to this set: the permit, rule or regulator's letter"
        required
      />
    </ActionForm>
  );
}
