// The built-in specification editions, checked against the table schema when this module loads.
import { loadEdition } from "@/lib/spec/spec.schema";
import type { Spec } from "@/lib/spec/spec.schema";
import type { EditionTable } from "@/lib/spec/spec.schema";
import { ASTM_D6751_23A } from "@/lib/spec/editions/astm-d6751-23a";
import { EN_14214_2019 } from "@/lib/spec/editions/en-14214-2019";

/** The edition tables as written (for the sources page, which lists each row once per edition). */
export const EDITION_TABLES: readonly EditionTable[] = [ASTM_D6751_23A, EN_14214_2019];

export const BUILT_IN_SPECS: readonly Spec[] = EDITION_TABLES.flatMap((t) => loadEdition(t));
