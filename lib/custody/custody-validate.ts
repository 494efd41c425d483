// What a custody state must satisfy before its ledger is built: declared sets and steps, whole-gram
// yields, a rule set within range, and bookings naming known sets and steps with whole grams.
import type { DomainIssue } from "@/lib/core/result";
import { isPositiveGrams } from "@/lib/custody/custody-rules";
import type { ConversionStep, CustodyState } from "@/lib/custody/custody-rules";

function validateSets(state: CustodyState, issues: DomainIssue[]): Set<string> {
  const setKeys = new Set<string>();
  state.sets.forEach((s, i) => {
    if (s.key.trim() === "")
      issues.push({
        code: "CUSTODY.INVALID_SET",
        message: "Characteristic set key must not be empty",
        field: `sets.${i}.key`,
      });
    if (setKeys.has(s.key))
      issues.push({
        code: "CUSTODY.DUPLICATE_SET",
        message: `Characteristic set ${s.key} is listed twice`,
        field: `sets.${i}.key`,
      });
    setKeys.add(s.key);
  });
  return setKeys;
}

function validateSteps(state: CustodyState, issues: DomainIssue[]): Map<string, ConversionStep> {
  const steps = new Map<string, ConversionStep>();
  state.steps.forEach((st, i) => {
    if (steps.has(st.id))
      issues.push({
        code: "CUSTODY.DUPLICATE_STEP",
        message: `Process step ${st.id} is listed twice`,
        field: `steps.${i}.id`,
      });
    steps.set(st.id, st);
    if (st.outputs.length === 0)
      issues.push({
        code: "CUSTODY.INVALID_STEP",
        message: `Process step ${st.id} has no outputs`,
        field: `steps.${i}.outputs`,
      });
    st.outputs.forEach((o, j) => {
      if (!Number.isSafeInteger(o.outputMassG) || o.outputMassG < 0 || !isPositiveGrams(o.inputMassG)) {
        issues.push({
          code: "CUSTODY.INVALID_FACTOR",
          message: `Process step ${st.id} → ${o.material}: measured yield must be whole grams (output ≥ 0, input > 0)`,
          field: `steps.${i}.outputs.${j}`,
        });
      }
    });
  });
  return steps;
}

function validateRules(state: CustodyState, issues: DomainIssue[]): void {
  const periodMonths = state.ruleSet.balancePeriodMonths[state.operatorType].value;
  if (!Number.isInteger(periodMonths) || periodMonths < 1 || periodMonths > 120) {
    issues.push({
      code: "CUSTODY.INVALID_RULESET",
      message: `Balance period must be 1–120 whole months, got ${periodMonths}`,
      field: "ruleSet.balancePeriodMonths",
    });
  }
  const anchor = state.ruleSet.periodAnchorMonth.value;
  if (!Number.isInteger(anchor) || anchor < 1 || anchor > 12) {
    issues.push({
      code: "CUSTODY.INVALID_RULESET",
      message: `Period start month must be 1–12, got ${anchor}`,
      field: "ruleSet.periodAnchorMonth",
    });
  }
  if (!Number.isInteger(state.utcOffsetMin) || Math.abs(state.utcOffsetMin) > 14 * 60) {
    issues.push({
      code: "CUSTODY.INVALID_OFFSET",
      message: "UTC offset must be whole minutes between −720 and +840",
      field: "utcOffsetMin",
    });
  }
}

function validateBookings(
  state: CustodyState,
  setKeys: ReadonlySet<string>,
  steps: ReadonlyMap<string, ConversionStep>,
  issues: DomainIssue[],
): void {
  const ids = new Set<string>();
  state.bookings.forEach((b, i) => {
    const f = `bookings.${i}`;
    if (ids.has(b.id))
      issues.push({ code: "CUSTODY.DUPLICATE_BOOKING", message: `Booking ${b.id} is listed twice`, field: `${f}.id` });
    ids.add(b.id);
    if (!Number.isSafeInteger(b.at))
      issues.push({
        code: "CUSTODY.INVALID_TIME",
        message: `Booking ${b.id}: time must be an instant in milliseconds`,
        field: `${f}.at`,
      });
    if (!setKeys.has(b.setKey))
      issues.push({
        code: "CUSTODY.UNKNOWN_SET",
        message: `Booking ${b.id}: characteristic set ${b.setKey} is not declared`,
        field: `${f}.setKey`,
      });
    const mass = b.kind === "CONVERSION" ? b.inputMassG : b.massG;
    if (!isPositiveGrams(mass)) {
      issues.push({
        code: "CUSTODY.INVALID_MASS",
        message: `Booking ${b.id}: mass must be whole grams above 0, got ${mass}`,
        field: `${f}.${b.kind === "CONVERSION" ? "inputMassG" : "massG"}`,
      });
    }
    if (b.kind === "CONVERSION" && !steps.has(b.stepId)) {
      issues.push({
        code: "CUSTODY.UNKNOWN_STEP",
        message: `Booking ${b.id}: process step ${b.stepId} is not defined`,
        field: `${f}.stepId`,
      });
    }
  });
}

/** Every issue of a custody state, in the order sets, steps, rule set, bookings, close-through time. */
export function validateState(state: CustodyState): DomainIssue[] {
  const issues: DomainIssue[] = [];
  const setKeys = validateSets(state, issues);
  const steps = validateSteps(state, issues);
  validateRules(state, issues);
  validateBookings(state, setKeys, steps, issues);
  if (state.closeThroughMs !== undefined && !Number.isSafeInteger(state.closeThroughMs)) {
    issues.push({
      code: "CUSTODY.INVALID_TIME",
      message: "Close-through time must be an instant in milliseconds",
      field: "closeThroughMs",
    });
  }
  return issues;
}
