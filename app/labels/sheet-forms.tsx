import { labelOf } from "@/lib/core/vocabulary";
import { day } from "@/app/_ui/format";

/** Choose lots from the recent ones for a sheet of lot labels (a plain GET form: the sheet is a link). */
export function LotSheetForm({
  recent,
  chosen,
  timeZone,
}: {
  recent: ReadonlyArray<{ code: string; material: string; receivedAt: Date }>;
  chosen: readonly string[];
  timeZone: string;
}) {
  return (
    <form method="get" action="/labels">
      <input type="hidden" name="kind" value="lot" />
      <fieldset>
        <legend>Lot labels: choose lots</legend>
        {recent.map((l) => (
          <label key={l.code} style={{ display: "inline-block", marginRight: "1rem", maxWidth: "100%" }}>
            <input type="checkbox" name="lot" value={l.code} defaultChecked={chosen.includes(l.code)} /> {l.code}{" "}
            <span className="muted">
              ({labelOf(l.material)}, {day(l.receivedAt, timeZone)})
            </span>
          </label>
        ))}
      </fieldset>
      <button type="submit">Make the lot sheet</button>
    </form>
  );
}

/** A run of container numbers for a sheet of container labels. */
export function ContainerSheetForm({ prefix, from, to }: { prefix: string; from: string; to: string }) {
  return (
    <form method="get" action="/labels">
      <input type="hidden" name="kind" value="container" />
      <fieldset>
        <legend>Container labels: a run of numbers</legend>
        <label>
          Prefix <input name="prefix" defaultValue={prefix} size={6} />
        </label>{" "}
        <label>
          From <input name="from" inputMode="numeric" defaultValue={from} size={5} />
        </label>{" "}
        <label>
          To <input name="to" inputMode="numeric" defaultValue={to} size={5} />
        </label>
      </fieldset>
      <button type="submit">Make the container sheet</button>
    </form>
  );
}
