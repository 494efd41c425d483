import { Cautions } from "@/app/_ui/kit";

/** Short lab cautions at the step they concern; the kit adds that the SDS, site procedures and local codes govern. */
export function LabCautions({ kind }: { kind: "titration" | "tests" }) {
  const items =
    kind === "titration"
      ? [
          "The titration solvent is an alcohol (isopropanol, or ethanol where the method allows): flammable, its vapour heavier than air. Warm it on a hot plate or water bath, never over a flame, and keep it capped.",
          "The sodium or potassium hydroxide titrant is corrosive, more so in alcohol: eye protection and gloves.",
          "Samples of melted fat or hot oil burn: let them cool to the method's temperature before weighing.",
        ]
      : [
          "Karl Fischer reagents are toxic and flammable; use them in a fume hood.",
          "Samples of melted fat or hot oil burn: let them cool to the method's temperature before weighing.",
        ];
  return <Cautions title="Cautions" items={items} />;
}
