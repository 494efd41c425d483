import "server-only";
// What the grid's saves and imports share: who may add rows to a table, one new row through its record
// service, and a view of the open transaction the record services join so a block commits as one.
import { futureObservation } from "@/lib/collect/time-skew";
import type { Db, Tx } from "@/lib/core/connect";
import type { Result } from "@/lib/core/result";
import { fail, ok } from "@/lib/core/result";
import type { SiteRole } from "@/lib/core/vocabulary";
import type { UnitSystem } from "@/lib/quantity/units";
import type { Actor } from "@/lib/core/actor";
import { createSource } from "@/lib/source/source.service";
import { recordPickup } from "@/lib/feedstock/pickup.service";
import { receiveDelivery, receiveLotFromPickups, recordLabTest } from "@/lib/feedstock/lot.service";
import { recordTitration } from "@/lib/feedstock/titration.service";
import type { GridTable } from "@/lib/grid/tables";
import type { AddableTable } from "@/lib/grid/rows";
import { isAddable } from "@/lib/grid/rows";

export interface GridActor extends Actor {
  role: SiteRole;
  unitSystem: UnitSystem;
}

/** The code of the refusal that rolls a preview back. */
export const PREVIEW = "GRID.PREVIEW_ONLY";

/**
 * A view of the open transaction that record services can take as their database: their own
 * `runInTransaction` then runs inside this one, so a batch of rows commits or rolls back as one.
 */
export function joinTransaction(tx: Tx): Db {
  return new Proxy(tx, {
    get(target, prop) {
      if (prop === "$transaction") return async (fn: (t: Tx) => Promise<unknown>) => fn(tx);
      return Reflect.get(target, prop) as unknown;
    },
  }) as Db;
}

export type Saved = { code?: string; id?: number };

export async function addRow(
  db: Db,
  actor: Actor,
  table: AddableTable,
  input: Record<string, unknown>,
): Promise<Result<Saved>> {
  switch (table) {
    case "sources":
      return createSource(db, actor, input);
    case "pickups": {
      const future = futureObservation(input.observedAt, actor.now);
      return future ? fail("PICKUP.IN_FUTURE", future, "observedAt") : recordPickup(db, actor, input);
    }
    case "lots":
      return input.supplierCode !== undefined || input.deliveryDocument !== undefined
        ? receiveDelivery(db, actor, input)
        : receiveLotFromPickups(db, actor, input);
    case "titrations":
      return recordTitration(db, actor, input);
    case "labTests":
      return recordLabTest(db, actor, input);
  }
}

export function requireAdder(table: GridTable, role: SiteRole): Result<true> {
  if (!isAddable(table.key) || table.addRoles.length === 0)
    return fail("GRID.READ_ONLY", `${table.label} are recorded elsewhere; this table is read-only here`, "table");
  if (!(table.addRoles as readonly string[]).includes(role))
    return fail(
      "AUTH.FORBIDDEN",
      `Adding ${table.label.toLowerCase()} needs one of these roles: ${table.addRoles.map((r) => r.toLowerCase()).join(", ")}`,
    );
  return ok(true);
}
