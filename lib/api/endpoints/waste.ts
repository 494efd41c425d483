import type { EndpointDoc } from "@/lib/api/openapi";
import {
  DisposalSchema,
  MarkContainerFullSchema,
  WasteCharacterisationEntrySchema,
  WasteContainerSchema,
} from "@/lib/waste/container.schema";

/** Waste container records and haul-aways. Writes need an Idempotency-Key header. */
export const WASTE_ENDPOINTS: EndpointDoc[] = [
  {
    method: "post",
    path: "/api/waste/containers",
    tag: "Waste",
    summary:
      "Open a waste container (production or compliance; Idempotency-Key header required). A duplicate code is 409; an accumulation start in a closed period is 409.",
    input: WasteContainerSchema,
  },
  {
    method: "post",
    path: "/api/waste/characterisation",
    tag: "Waste",
    summary:
      "Record a container's characterisation: methanol % v/v, pH, closed-cup flash point °C, water % by weight, with the test date; at least one value. Replaces the stored values; hazard flags and due dates use them at once. Refused (409) once the container is hauled away.",
    input: WasteCharacterisationEntrySchema,
  },
  {
    method: "post",
    path: "/api/waste/full",
    tag: "Waste",
    summary: "Mark an open container full on a date; 409 when it is already full or hauled away.",
    input: MarkContainerFullSchema,
  },
  {
    method: "post",
    path: "/api/waste/disposals",
    tag: "Waste",
    summary:
      "Record a haul-away (compliance): hauler, manifest or document number, collected time, kg, destination facility. More than the container holds, a duplicate manifest number or a closed period is 409; a time before the accumulation start is 422. A container emptied by the haul is marked hauled away.",
    input: DisposalSchema,
  },
];
