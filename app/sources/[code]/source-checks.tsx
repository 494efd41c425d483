import type { Db } from "@/lib/core/connect";
import { labelOf, SOURCE_KINDS } from "@/lib/core/vocabulary";
import { CAPACITY_BASES, plausibleLitresPerMonth } from "@/lib/screening/capacity";
import { listFlags } from "@/lib/screening/screening.store";
import { getSourceProfile } from "@/lib/screening/source-profile.store";
import type { SourceProfileRow } from "@/lib/screening/source-profile.store";
import { day } from "@/app/_ui/format";
import { ActionForm, Field } from "@/app/_ui/kit/action-form";
import { DataTable, StatusMark } from "@/app/_ui/kit";
import { Facts } from "@/app/_ui/ui";
import { clearSourceAction, saveSourceProfileAction } from "@/app/screening/actions";
import { flagColumns } from "@/app/screening/flag-columns";

const n = (v: number | null) => (v === null ? "" : String(v));

function capacityText(p: SourceProfileRow): string {
  if (p.capacityBasis === null) return "not declared";
  const l = plausibleLitresPerMonth({
    basis: p.capacityBasis as "FRYERS" | "MONTHLY",
    fryers: p.fryers,
    fryerLitres: p.fryerLitres,
    changesPerWeek: p.changesPerWeek,
    declaredLitresPerMonth: p.declaredLitresPerMonth,
  });
  const how =
    p.capacityBasis === "FRYERS"
      ? `${p.fryers ?? "?"} fryers × ${p.fryerLitres ?? "?"} L × ${p.changesPerWeek ?? "?"} changes a week`
      : "declared monthly volume";
  return `${l === null ? "—" : `${Math.round(l).toLocaleString("en-GB")} L a month`} (${how})`;
}

function ProfileForm({ code, p }: { code: string; p: SourceProfileRow }) {
  return (
    <details>
      <summary>Change capacity, hours and location</summary>
      <ActionForm
        action={saveSourceProfileAction}
        submitLabel="Save capacity and hours"
        label="Capacity and hours"
        hidden={{ sourceCode: code }}
        keepValues
      >
        <Field
          name="kind"
          label="Kind"
          type="select"
          defaultValue={p.kind}
          options={SOURCE_KINDS.map((k) => [k, labelOf(k)] as const)}
        />
        <Field
          name="capacityBasis"
          label="Capacity declared as"
          type="select"
          defaultValue={p.capacityBasis ?? ""}
          options={[["", "Not declared"], ...CAPACITY_BASES.map((b) => [b, labelOf(b)] as const)]}
        />
        <Field name="fryers" label="Fryers" type="number" defaultValue={n(p.fryers)} />
        <Field name="fryerLitres" label="Litres per fryer" unit="L" type="number" defaultValue={n(p.fryerLitres)} />
        <Field name="changesPerWeek" label="Oil changes a week" type="number" defaultValue={n(p.changesPerWeek)} />
        <Field
          name="declaredLitresPerMonth"
          label="Declared volume"
          unit="L a month"
          type="number"
          defaultValue={n(p.declaredLitresPerMonth)}
        />
        <Field
          name="capacityDeclaredAt"
          label="Declared on"
          type="date"
          defaultValue={p.capacityDeclaredAt ? p.capacityDeclaredAt.toISOString().slice(0, 10) : ""}
        />
        <Field
          name="capacityDeclaredBy"
          label="Declared by"
          maxLength={120}
          defaultValue={p.capacityDeclaredBy ?? ""}
        />
        <Field
          name="pickupEveryDays"
          label="Usual pickup interval"
          unit="days"
          type="number"
          defaultValue={n(p.pickupEveryDays)}
        />
        <Field name="opensHour" label="Opens at" unit="hour, 0–24" type="number" defaultValue={n(p.opensHour)} />
        <Field name="closesHour" label="Closes at" unit="hour, 0–24" type="number" defaultValue={n(p.closesHour)} />
        <Field name="latitude" label="Latitude of the address" unit="°" type="number" defaultValue={n(p.latitude)} />
        <Field name="longitude" label="Longitude of the address" unit="°" type="number" defaultValue={n(p.longitude)} />
      </ActionForm>
    </details>
  );
}

/** The source's standing, plausible volume, hours and place, as the checks use them. */
function SourceStanding({
  p,
  standing,
  timeZone,
}: {
  p: SourceProfileRow;
  standing: readonly string[];
  timeZone: string;
}) {
  return (
    <Facts
      items={[
        [
          "Standing",
          standing.length === 0 ? (
            "No concerns recorded"
          ) : (
            <>
              {standing.map((s) => (
                <StatusMark key={s} code={s} />
              ))}
            </>
          ),
        ],
        ["Plausible volume", capacityText(p)],
        [
          "Declared",
          p.capacityDeclaredAt
            ? `${day(p.capacityDeclaredAt, timeZone)}${p.capacityDeclaredBy ? ` by ${p.capacityDeclaredBy}` : ""}`
            : "—",
        ],
        [
          "Opening hours",
          p.opensHour === null || p.closesHour === null
            ? "not known"
            : `${String(p.opensHour).padStart(2, "0")}:00–${String(p.closesHour).padStart(2, "0")}:00`,
        ],
        [
          "Location of the address",
          p.latitude === null || p.longitude === null
            ? "not known"
            : `${p.latitude.toFixed(4)}, ${p.longitude.toFixed(4)}`,
        ],
      ]}
    />
  );
}

/** The source's declared capacity and hours, its standing, and every flag raised against it with its decision. */
export async function SourceChecks({
  db,
  siteId,
  sourceId,
  code,
  timeZone,
  compliance,
}: {
  db: Db;
  siteId: number;
  sourceId: number;
  code: string;
  timeZone: string;
  compliance: boolean;
}) {
  const [p, flags] = await Promise.all([
    getSourceProfile(db, siteId, code),
    listFlags(db, siteId, { sourceId, take: 200 }),
  ]);
  if (p === null) return null;
  const c = flagColumns(timeZone);
  const standing = [p.onWatch ? "ON_WATCH" : null, p.creditWithheld ? "CREDIT_WITHHELD" : null].filter(
    (x): x is string => x !== null,
  );
  return (
    <section aria-labelledby="checks-h">
      <h2 id="checks-h">Source checks</h2>
      <SourceStanding p={p} standing={standing} timeZone={timeZone} />
      {compliance ? <ProfileForm code={code} p={p} /> : null}
      {compliance && standing.length > 0 ? (
        <ActionForm
          action={clearSourceAction}
          submitLabel="Clear this source"
          label="Clear this source"
          hidden={{ sourceCode: code }}
        >
          <Field name="reason" label="Why the source is cleared" type="textarea" maxLength={500} required />
        </ActionForm>
      ) : null}
      <h3>Flags and decisions</h3>
      <DataTable
        caption="Flags raised against this source"
        hideCaption
        columns={[c.raised, c.check, c.found, c.records, c.state, c.decidedWhenBy, c.reason]}
        rows={flags}
        rowKey={(f) => f.id}
        empty="No flags raised against this source."
      />
    </section>
  );
}
