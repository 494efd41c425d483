// The bench's warm forward trace alone (npm run bench's "forward: early lot", warm), repeated many times
// so that a change can be timed against the code before it under the same conditions, and profiled
// (node --cpu-prof). Prints a digest of the answer, then wall and CPU time per trace: on a shared
// machine the process's CPU time moves less than the wall clock.
// node --conditions=react-server --import tsx bench/forward-focus.ts [runs, default 200] [years, default 10]
import { createHash } from "node:crypto";
import { generatePlantHistory, getMonthStartMs } from "@/bench/plant-history";
import { indexLedger } from "@/lib/ledger/moves";
import { replayLedger, traceForward } from "@/lib/trace/genealogy";
import type { Result } from "@/lib/core/result";

function requireOk<T>(what: string, r: Result<T>): T {
  if (!r.ok) throw new Error(`${what}: ${r.issues.map((i) => i.message).join("; ")}`);
  return r.value;
}
const runs = Number(process.argv[2] ?? 200);
const years = Number(process.argv[3] ?? 10);
const h = generatePlantHistory({ years });
const index = requireOk("index", indexLedger(h.holders, h.moves));
const earlyAt = getMonthStartMs(h.probes.earlyLotFirstEntryMs);
const early = requireOk("replay", replayLedger(index, { until: earlyAt - 1 })).snapshot();
const answer = requireOk("fwd", traceForward(index, h.probes.earlyLotOriginIds, { from: early }));
const cold = requireOk("fwd", traceForward(index, h.probes.earlyLotOriginIds));
const digest = (x: unknown) => createHash("sha256").update(JSON.stringify(x)).digest("hex").slice(0, 16);
console.log(
  `answer ${digest(answer)} cold ${digest(cold)} replayed ${answer.movesReplayed} moves ${answer.moves.length}`,
);
const samples: number[] = [];
const cpu: number[] = [];
for (let i = 0; i < runs; i++) {
  const c0 = process.cpuUsage();
  const t0 = performance.now();
  traceForward(index, h.probes.earlyLotOriginIds, { from: early });
  samples.push(performance.now() - t0);
  const c = process.cpuUsage(c0);
  cpu.push((c.user + c.system) / 1000);
}
const q = (xs: number[], p: number) => {
  const s = [...xs].sort((a, b) => a - b);
  return (s[Math.min(s.length, Math.max(1, Math.ceil((p / 100) * s.length))) - 1] ?? NaN).toFixed(2);
};
console.log(
  `runs ${runs} wall median ${q(samples, 50)} p95 ${q(samples, 95)} min ${q(samples, 0)} | cpu median ${q(cpu, 50)} p95 ${q(cpu, 95)}`,
);
