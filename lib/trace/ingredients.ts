// What a batch or product lot is made of, as the trade reads it: feedstock lots are the ingredients
// and carry the shares; methanol and catalyst are reagents, listed apart with the mass the mixing rules
// assign them; water is never an ingredient (it is used for washing and leaves with the wash water),
// so water a ledger still routes through a batch is listed with the reagents and never gets a share.
// The grams per origin come from the mixing-aware replay unchanged; only the presentation splits them.

export interface OriginGroup {
  kind: "LOT" | "REAGENT_LOT" | "OTHER";
  code: string;
  grams: number;
  /** For a reagent lot: what it holds (METHANOL, KOH, WATER…). */
  reagent?: string;
}

export interface IngredientShare extends OriginGroup {
  /** Share of the feedstock in the holder, in % (0 for reagents: they are not shares of the product). */
  pct: number;
}

export interface Ingredients {
  /** Feedstock grams: the base of the shares. */
  feedstockG: number;
  feedstock: IngredientShare[];
  reagents: IngredientShare[];
}

export function splitIngredients(groups: readonly OriginGroup[]): Ingredients {
  const feedstockGroups = groups.filter((g) => g.kind !== "REAGENT_LOT");
  const feedstockG = feedstockGroups.reduce((s, g) => s + g.grams, 0);
  const order = (a: OriginGroup, b: OriginGroup) => b.grams - a.grams || a.code.localeCompare(b.code);
  return {
    feedstockG,
    feedstock: feedstockGroups
      .map((g) => ({ ...g, pct: feedstockG === 0 ? 0 : (g.grams * 100) / feedstockG }))
      .sort(order),
    reagents: groups
      .filter((g) => g.kind === "REAGENT_LOT")
      .map((g) => ({ ...g, pct: 0 }))
      .sort(order),
  };
}
