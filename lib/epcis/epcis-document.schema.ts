// Our own zod statement of the rules of the GS1 EPCIS 2.0 JSON Schema (the EPCIS 2.0.0 JSON Schema
// published by GS1: EPCIS-Document, event-definitions, ObjectEvent, TransformationEvent, bizStep),
// for the parts our export uses. Used to check the export and to document the endpoint.
import { z } from "zod";

/** An absolute URI (RFC 3986 scheme ":" rest), as JSON Schema "format": "uri" requires. */
const uri = z.string().regex(/^[A-Za-z][A-Za-z0-9+.-]*:[^\s]+$/, "must be an absolute URI");
const time = z.iso.datetime({ offset: true });
const timeZoneOffset = z
  .string()
  .regex(/^([+]|[-])((0[0-9]|1[0-3]):([0-5][0-9])|14:00)$/, "must be ±hh:mm between -13:59 and +14:00");

export const CBV_BIZ_STEPS = [
  "accepting",
  "arriving",
  "assembling",
  "collecting",
  "commissioning",
  "consigning",
  "creating_class_instance",
  "cycle_counting",
  "decommissioning",
  "departing",
  "destroying",
  "disassembling",
  "dispensing",
  "encoding",
  "entering_exiting",
  "holding",
  "inspecting",
  "installing",
  "killing",
  "loading",
  "other",
  "packing",
  "picking",
  "receiving",
  "removing",
  "repackaging",
  "repairing",
  "replacing",
  "reserving",
  "retail_selling",
  "shipping",
  "staging_outbound",
  "stock_taking",
  "stocking",
  "storing",
  "transporting",
  "unloading",
  "unpacking",
  "void_shipping",
  "sensor_reporting",
  "sampling",
] as const;
/** A CBV bare word, or a URI that is not the long form of a CBV word. */
const bizStep = z.union([
  z.enum(CBV_BIZ_STEPS),
  uri.refine(
    (v) => !/^(https:\/\/ns\.gs1\.org\/cbv\/BizStep-|urn:epcglobal:cbv:bizstep)/.test(v),
    "use the bare CBV word",
  ),
]);
const SOURCE_DEST_TYPES = ["owning_party", "possessing_party", "location"] as const;
const sourceDestType = z.union([z.enum(SOURCE_DEST_TYPES), uri]);

const quantityElement = z.strictObject({
  epcClass: uri,
  quantity: z.number(),
  uom: z
    .string()
    .regex(/^[A-Z0-9]{2,3}$/)
    .optional(),
});
const quantityList = z.array(quantityElement);
const epcList = z.array(uri).refine((l) => new Set(l).size === l.length, "items must be unique");
const place = z.object({ id: uri });

const COMMON_KEYS = [
  "@context",
  "type",
  "eventTime",
  "recordTime",
  "eventTimeZoneOffset",
  "eventID",
  "errorDeclaration",
  "certificationInfo",
];

const eventBase = {
  eventTime: time,
  recordTime: time.optional(),
  eventTimeZoneOffset: timeZoneOffset,
  eventID: uri.optional(),
  bizStep: bizStep.optional(),
  disposition: z.union([z.string().regex(/^[a-z_]+$/), uri]).optional(),
  readPoint: place.optional(),
  bizLocation: place.optional(),
  bizTransactionList: z
    .array(z.strictObject({ type: z.union([z.string().regex(/^[a-z_]+$/), uri]).optional(), bizTransaction: uri }))
    .optional(),
  sourceList: z.array(z.strictObject({ type: sourceDestType, source: uri })).optional(),
  destinationList: z.array(z.strictObject({ type: sourceDestType, destination: uri })).optional(),
  ilmd: z.record(z.string(), z.unknown()).optional(),
};

/** Keys outside the standard's own must be namespaced (compact IRIs or URIs), like "example:myField". */
function extensionsNamespaced(known: readonly string[]) {
  return (e: Record<string, unknown>, ctx: z.RefinementCtx) => {
    for (const k of Object.keys(e))
      if (!known.includes(k) && !COMMON_KEYS.includes(k) && !k.includes(":"))
        ctx.addIssue({
          code: "custom",
          message: `${k} is neither an EPCIS field nor a namespaced extension`,
          path: [k],
        });
  };
}

const objectEvent = z
  .looseObject({
    type: z.literal("ObjectEvent"),
    action: z.enum(["OBSERVE", "ADD", "DELETE"]),
    epcList: epcList.optional(),
    quantityList: quantityList.optional(),
    ...eventBase,
  })
  .superRefine(
    extensionsNamespaced([
      "action",
      "epcList",
      "quantityList",
      ...Object.keys(eventBase),
      "persistentDisposition",
      "sensorElementList",
    ]),
  )
  .refine(
    (e) => e.epcList !== undefined || (e.quantityList?.length ?? 0) >= 1,
    "an ObjectEvent needs epcList or a non-empty quantityList",
  )
  .refine((e) => e.ilmd === undefined || e.action === "ADD", "ilmd is allowed only with action ADD");

const transformationEvent = z
  .looseObject({
    type: z.literal("TransformationEvent"),
    inputEPCList: epcList.optional(),
    inputQuantityList: quantityList.optional(),
    outputEPCList: epcList.optional(),
    outputQuantityList: quantityList.optional(),
    transformationID: uri.optional(),
    ...eventBase,
  })
  .superRefine(
    extensionsNamespaced([
      "inputEPCList",
      "inputQuantityList",
      "outputEPCList",
      "outputQuantityList",
      "transformationID",
      ...Object.keys(eventBase),
      "persistentDisposition",
      "sensorElementList",
    ]),
  )
  .refine((e) => {
    const inputs = (e.inputEPCList?.length ?? 0) + (e.inputQuantityList?.length ?? 0) > 0;
    const outputs = (e.outputEPCList?.length ?? 0) + (e.outputQuantityList?.length ?? 0) > 0;
    return (inputs && outputs) || ((inputs || outputs) && e.transformationID !== undefined);
  }, "a TransformationEvent needs inputs and outputs, or one of them and a transformationID");

export const EpcisEventSchema = z.discriminatedUnion("type", [objectEvent, transformationEvent]);

export const EpcisDocumentSchema = z.object({
  "@context": z.union([uri, z.array(z.union([uri, z.record(z.string(), z.unknown())])).min(1)]),
  type: z.literal("EPCISDocument"),
  schemaVersion: z.string(),
  creationDate: time,
  epcisBody: z.object({ eventList: z.array(EpcisEventSchema) }),
});
