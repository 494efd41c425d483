import { Cautions } from "@/app/_ui/kit";

/** The usual cautions at loading, shown next to the shipment form. */
export function LoadingCautions() {
  return (
    <Cautions
      title="Before loading"
      items={[
        "Bond and earth the vehicle to the loading point before the hose goes in.",
        "Check the compartment is empty, clean and dry: one that last carried a lighter fuel can still hold flammable vapour.",
        "Keep ignition sources away from the loading bay; if product escapes, stop loading and use the spill kit.",
      ]}
    />
  );
}
