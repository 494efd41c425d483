import type { Highs } from "highs";
import { invariant } from "@/lib/core/result";

// Thin wrapper over HiGHS (WebAssembly) that takes a dense model and writes CPLEX LP text.
// Loading the Wasm reads one file once per process; the solve itself is deterministic.

let solverPromise: Promise<Highs> | undefined;

export function loadLinearSolver(): Promise<Highs> {
  if (solverPromise === undefined) {
    solverPromise = import("highs")
      .then((mod) => mod.default())
      .catch((error: unknown) => {
        solverPromise = undefined;
        throw error;
      });
  }
  return solverPromise;
}

export interface LinearColumn {
  lower: number;
  upper: number;
  binary?: boolean;
}

export interface LinearRow {
  /** Dense coefficients, one per column. */
  coefs: readonly number[];
  lower?: number;
  upper?: number;
}

export interface LinearModel {
  /** Minimised. */
  objective: readonly number[];
  columns: readonly LinearColumn[];
  rows: readonly LinearRow[];
}

export type LinearOutcome =
  | { status: "OPTIMAL" | "LIMIT_WITH_SOLUTION"; values: number[]; objective: number }
  | { status: "INFEASIBLE" }
  | { status: "FAILED"; detail: string };

function num(value: number): string {
  invariant(Number.isFinite(value), `non-finite coefficient ${value}`);
  return String(value);
}

function expression(coefs: readonly number[], keepZeros = false): string {
  const parts: string[] = [];
  coefs.forEach((c, j) => {
    if (c === 0 && !keepZeros) return;
    parts.push(`${c < 0 ? "-" : "+"} ${num(Math.abs(c))} x${j}`);
  });
  return parts.length > 0 ? parts.join(" ") : "0 x0";
}

/** Zero objective terms are kept so every column exists in the parsed model. */
export function formatLpText(model: LinearModel): string {
  invariant(model.columns.length > 0, "model needs at least one column");
  invariant(model.objective.length === model.columns.length, "objective length must match the columns");
  const lines: string[] = ["Minimize", ` obj: ${expression(model.objective, true)}`, "Subject To"];
  model.rows.forEach((row, i) => {
    invariant(row.coefs.length === model.columns.length, `row ${i} length must match the columns`);
    const expr = expression(row.coefs);
    if (row.lower !== undefined && row.upper !== undefined && row.lower === row.upper) {
      lines.push(` r${i}: ${expr} = ${num(row.upper)}`);
      return;
    }
    if (row.upper !== undefined) lines.push(` r${i}u: ${expr} <= ${num(row.upper)}`);
    if (row.lower !== undefined) lines.push(` r${i}l: ${expr} >= ${num(row.lower)}`);
  });
  lines.push("Bounds");
  model.columns.forEach((col, j) => lines.push(` ${num(col.lower)} <= x${j} <= ${num(col.upper)}`));
  const binaries = model.columns.flatMap((col, j) => (col.binary ? [`x${j}`] : []));
  if (binaries.length > 0) lines.push("Binaries", ` ${binaries.join(" ")}`);
  lines.push("End");
  return lines.join("\n");
}

export interface SolveOptions {
  timeLimitSeconds?: number;
}

export async function solveLinearModel(model: LinearModel, options: SolveOptions = {}): Promise<LinearOutcome> {
  const highs = await loadLinearSolver();
  const result = highs.solve(formatLpText(model), {
    output_flag: false,
    mip_rel_gap: 0,
    time_limit: options.timeLimitSeconds ?? 10,
  });
  if (result.Status === "Infeasible" || result.Status === "Primal infeasible or unbounded") {
    return { status: "INFEASIBLE" };
  }
  const limited = result.Status === "Time limit reached" || result.Status === "Iteration limit reached";
  if (result.Status !== "Optimal" && !limited) return { status: "FAILED", detail: result.Status };
  const values: number[] = [];
  for (let j = 0; j < model.columns.length; j++) {
    const column = result.Columns[`x${j}`];
    const primal = column !== undefined && "Primal" in column ? column.Primal : undefined;
    if (typeof primal !== "number" || !Number.isFinite(primal)) {
      return { status: "FAILED", detail: `${result.Status} without a value for x${j}` };
    }
    values.push(primal);
  }
  return { status: limited ? "LIMIT_WITH_SOLUTION" : "OPTIMAL", values, objective: result.ObjectiveValue };
}
