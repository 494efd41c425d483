// The titration's arithmetic written out with the analyst's own figures, so the screen shows how the
// acid value and the FFA come from the readings before anything is saved. Pure.
import { failMany, ok } from "@/lib/core/result";
import type { Result } from "@/lib/core/result";
import {
  ACID_VALUE_KOH_CONSTANT,
  FFA_FACTORS,
  KOH_MOLAR_MASS_G_MOL,
  calculateAcidValue,
  calculateFfaPercent,
  ffaFromAcidValue,
} from "@/lib/titration/titration";
import type { FfaBasis, TitrationInput } from "@/lib/titration/titration";

export interface TitrationWorking {
  netTitreMl: number;
  /** ISO 660 / AOCS Cd 3d-63 form: AV = (V − B) × c × 56.1 / m. */
  acidValueMgKohG: number;
  /** AOCS Ca 5a-40: FFA = (V − B) × c × F / m, F the method's factor for the basis (the value stored). */
  ffaPct: number;
  /** The same titration's FFA from its acid value by the basis acid's molar mass. */
  ffaFromAcidValuePct: number;
  lines: string[];
}

const BASIS_WORD: Readonly<Record<FfaBasis, string>> = { OLEIC: "oleic", PALMITIC: "palmitic", LAURIC: "lauric" };

function fx(n: number, d: number): string {
  return n.toFixed(d);
}

/** The acid value and FFA of one titration with each step written out. */
export function workTitration(input: TitrationInput, basis: FfaBasis): Result<TitrationWorking> {
  const av = calculateAcidValue(input);
  const ffa = calculateFfaPercent(input, { basis });
  if (!av.ok || !ffa.ok) return failMany([...(av.ok ? [] : av.issues), ...(ffa.ok ? [] : ffa.issues)]);
  const fromAv = ffaFromAcidValue(av.value.acidValueMgKohG, { basis });
  if (!fromAv.ok) return fromAv;
  const b = input.blankMl ?? 0;
  const v = av.value.netTitreMl;
  const m = FFA_FACTORS[basis].molarMassGMol;
  const reading = `${fx(v, 2)} mL × ${fx(input.concentrationMolL, 4)} mol/L`;
  return ok({
    netTitreMl: v,
    acidValueMgKohG: av.value.acidValueMgKohG,
    ffaPct: ffa.value.ffaPct,
    ffaFromAcidValuePct: fromAv.value,
    lines: [
      `Net titre = titre − blank = ${fx(input.titreMl, 2)} − ${fx(b, 2)} = ${fx(v, 2)} mL`,
      `Acid value = (titre − blank) × concentration × ${ACID_VALUE_KOH_CONSTANT.value} ÷ sample mass = ${reading} × ${ACID_VALUE_KOH_CONSTANT.value} ÷ ${fx(input.sampleMassG, 3)} g = ${fx(av.value.acidValueMgKohG, 2)} mg KOH/g (ISO 660, AOCS Cd 3d-63)`,
      `FFA as ${BASIS_WORD[basis]} = (titre − blank) × concentration × ${fx(ffa.value.factor, 1)} ÷ sample mass = ${reading} × ${fx(ffa.value.factor, 1)} ÷ ${fx(input.sampleMassG, 3)} g = ${fx(ffa.value.ffaPct, 2)} % (AOCS Ca 5a-40)`,
      `From the acid value: FFA = acid value × ${fx(m, 3)} ÷ (10 × ${KOH_MOLAR_MASS_G_MOL}) = ${fx(av.value.acidValueMgKohG, 2)} × ${fx(m, 3)} ÷ ${fx(10 * KOH_MOLAR_MASS_G_MOL, 3)} = ${fx(fromAv.value, 2)} % as ${BASIS_WORD[basis]} (molar masses, IUPAC 2021 atomic weights)`,
    ],
  });
}
