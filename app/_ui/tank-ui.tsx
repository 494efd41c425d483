import type { TankLevel } from "@/lib/tank/tank.store";
import { num } from "@/app/_ui/format";
import { Note } from "@/app/_ui/ui";

const MATERIAL_WORDS: Readonly<Record<string, string>> = {
  USED_COOKING_OIL: "used cooking oil",
  FAME: "methyl ester",
  GLYCEROL: "glycerol",
  WATER: "water",
  METHANOL: "methanol",
  OTHER_OIL: "vegetable oil",
};

export function FillBar({ tank }: { tank: TankLevel }) {
  const shown = Math.max(0, Math.min(100, tank.fillPct));
  return (
    <div className="fill" title={`${num(tank.fillPct, 1)} % of capacity at nominal density`}>
      <div className="fill-track" aria-hidden="true">
        <div className={`fill-bar${tank.fillPct > 100 ? " over" : ""}`} style={{ width: `${shown}%` }} />
      </div>
      <span className="fill-pct">{num(tank.fillPct, 0)} %</span>
    </div>
  );
}

export function DensityNote({ tanks }: { tanks: TankLevel[] }) {
  const seen = new Map<string, number>();
  for (const t of tanks) seen.set(t.nominalMaterial, t.nominalDensityKgM3);
  const list = [...seen].map(([m, rho]) => `${MATERIAL_WORDS[m] ?? m.toLowerCase()} ${num(rho, 0)} kg/m³`).join(", ");
  return (
    <Note>
      Fill % is an estimate: book stock ÷ (capacity × a nominal density at 15 °C for the tank&apos;s service, from the
      default density table: {list}). Real density depends on the material and its temperature; a gauge reading is the
      measurement.
    </Note>
  );
}
