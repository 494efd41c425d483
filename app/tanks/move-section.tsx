import type { ReactNode } from "react";
import type { Db } from "@/lib/core/connect";
import { labelOf } from "@/lib/core/vocabulary";
import type { SiteRole } from "@/lib/core/vocabulary";
import { listTankLevels } from "@/lib/tank/tank.store";
import type { DensityEntry } from "@/lib/quantity/density";
import { Cautions } from "@/app/_ui/kit";
import { kg } from "@/app/_ui/format";
import { MoveForm } from "@/app/tanks/move-form";
import { siteLocalInput } from "@/app/tanks/site-clock";

/** Hot oil and pumping: the cautions shown wherever material is moved into a tank. */
export const TANK_MOVE_CAUTIONS: readonly ReactNode[] = [
  "Oil may be hot: hot oil burns. Wear the gloves, face shield and clothing your site requires, and keep hoses and couplings secure before pumping.",
  "Before pumping, check the destination's valve line-up and the tank's level, so nothing goes to the wrong tank or overflows.",
];

/** "Move into a tank" on a lot's or a tank's page; the form only for production staff and drawable material. */
export async function MoveSection(props: {
  db: Db;
  siteId: number;
  timeZone: string;
  now: Date;
  role: SiteRole;
  from: { kind: "LOT" | "TANK"; code: string; service: string; stockG: number };
  /** Why the material cannot be moved now, when it cannot (e.g. a lot awaiting the lab). */
  blocked?: string;
  density: { entry: DensityEntry; densityKgM3?: number; referenceTempC?: number; basis: string };
  title: string;
}) {
  const { from } = props;
  const tanks = (await listTankLevels(props.db, props.siteId)).filter(
    (t) => t.service === from.service && !(from.kind === "TANK" && t.code === from.code),
  );
  let body: ReactNode;
  if (props.role !== "PRODUCTION") body = <p className="muted">Production staff move material into tanks.</p>;
  else if (props.blocked) body = <p className="muted">{props.blocked}</p>;
  else if (from.stockG <= 0) body = <p className="muted">Nothing is left to move.</p>;
  else if (tanks.length === 0)
    body = <p className="muted">No other {labelOf(from.service).toLowerCase()} tank is set up at this site.</p>;
  else {
    const choices = tanks.map((t) => ({
      code: t.code,
      label: `${t.code} ${t.name} — room for about ${kg(Math.max(0, t.capacityG - t.stockG), 0)}`,
    }));
    body = (
      <>
        <Cautions items={TANK_MOVE_CAUTIONS} title="Before pumping" />
        <MoveForm
          fromKind={from.kind}
          fromCode={from.code}
          tanks={choices}
          nowLocal={siteLocalInput(props.now, props.timeZone)}
          density={props.density}
          heldText={kg(from.stockG, 1)}
          label={props.title}
        />
      </>
    );
  }
  return (
    <section aria-labelledby="move-h">
      <h2 id="move-h">{props.title}</h2>
      {body}
    </section>
  );
}
