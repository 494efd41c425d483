// The cautions printed on a recipe card, step by step; they defer to the safety data sheets and site procedures.
import type { Catalyst } from "@/lib/core/vocabulary";
import { CATALYSTS as CATALYST_PROFILES } from "@/lib/recipe/catalyst";

// ---- the card -----------------------------------------------------------------------------------

export type CautionStep = "METHANOL" | "CATALYST" | "ACID" | "HOT_OIL" | "GLYCEROL" | "GENERAL";

export interface Caution {
  step: CautionStep;
  text: string;
}

/** Our own short cautions; they point to the safety data sheets and site procedures, they do not replace them. */
export function listCautions(opts: { catalyst: Catalyst; acidStep: boolean }): Caution[] {
  const methoxide = CATALYST_PROFILES[opts.catalyst].form === "METHANOL_SOLUTION";
  const cautions: Caution[] = [
    {
      step: "METHANOL",
      text: "Methanol is toxic if swallowed, breathed in or absorbed through the skin, and highly flammable: its vapour ignites easily and its flame is hard to see. No ignition sources, good ventilation, bond and earth containers when transferring.",
    },
    {
      step: "CATALYST",
      text: methoxide
        ? "Methoxide solution is corrosive and flammable and reacts with water and moist air; keep it closed and dry. Wear eye and face protection and chemical gloves."
        : "Sodium and potassium hydroxide are corrosive to eyes and skin and react with water and with methanol, giving off heat; the methoxide they form in methanol is corrosive too. Keep them dry, mix in a closed vessel, wear eye and face protection and chemical gloves.",
    },
  ];
  if (opts.acidStep) {
    cautions.push({
      step: "ACID",
      text: "Concentrated sulfuric acid is corrosive and reacts violently with water, giving off heat: add the acid slowly to the methanol, never water or methanol onto the acid. Eye and face protection, acid-resistant gloves.",
    });
  }
  cautions.push(
    {
      step: "HOT_OIL",
      text: "Hot oil and a warm reactor cause burns; water in hot oil can boil and spatter. Keep the reaction below the methanol boiling point unless the vessel is rated for it.",
    },
    {
      step: "GLYCEROL",
      text: "The glycerol phase and recovered methanol contain methanol: flammable, store and handle them like methanol.",
    },
    {
      step: "GENERAL",
      text: "Work to the safety data sheets of every chemical, the site's own procedures and local fire and building codes; only trained staff run a batch.",
    },
  );
  return cautions;
}
