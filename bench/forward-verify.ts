// One digest of many trace answers on the bench's synthetic history, to show a change to the replay
// leaves every answer byte for byte as it was: the full replay's final state, forward traces of lots
// and pickups (from the ledger start, from the month before entry, from a month after entry, and up to
// a time), and backward traces of holders and moves from monthly snapshots. Run it before and after:
// node --conditions=react-server --import tsx bench/forward-verify.ts [years, default 3]
import { createHash } from "node:crypto";
import { generatePlantHistory, getMonthStartMs } from "@/bench/plant-history";
import { indexLedger } from "@/lib/ledger/moves";
import { createReplay } from "@/lib/trace/replay";
import { findEntryOrigins, traceForward, traceHolder, traceMove } from "@/lib/trace/genealogy";
import type { ReplaySnapshot } from "@/lib/trace/replay";
import type { Result } from "@/lib/core/result";

function requireOk<T>(what: string, r: Result<T>): T {
  if (!r.ok) throw new Error(`${what}: ${r.issues.map((i) => i.message).join("; ")}`);
  return r.value;
}
const years = Number(process.argv[2] ?? 3);
const h = generatePlantHistory({ years });
const index = requireOk("index", indexLedger(h.holders, h.moves));
const snaps: ReplaySnapshot[] = [];
const replay = createReplay(index.holders);
index.moves.forEach((m, pos) => {
  requireOk("apply", replay.apply(m));
  const next = index.moves[pos + 1];
  if (next !== undefined && getMonthStartMs(next.at) !== getMonthStartMs(m.at)) snaps.push(replay.snapshot());
});
const full = JSON.stringify(replay.snapshot());
const hash = createHash("sha256");
hash.update(full);
const covering = (pos: number) => [...snaps].reverse().find((s) => s.applied.count <= pos);
const lots = h.holders.filter((x) => x.kind === "LOT");
const pickups = h.holders.filter((x) => x.kind === "PICKUP");
const picks = [
  ...lots.filter((_, i) => i % Math.ceil(lots.length / 25) === 0),
  ...pickups.filter((_, i) => i % Math.ceil(pickups.length / 10) === 0),
];
let n = 0;
for (const holder of picks) {
  const origins =
    holder.kind === "LOT"
      ? requireOk("lot", traceHolder(index, holder.id)).received.origins.map((o) => o.originId)
      : findEntryOrigins(index, [holder.id]);
  if (origins.length === 0) continue;
  const first = Math.min(...origins.map((id) => index.positionOf.get(id) ?? 0));
  const before = covering(first);
  const after = covering(first + 200);
  const endAt = index.moves[Math.min(index.moves.length - 1, first + 3000)]?.at;
  const answers = [
    traceForward(index, origins),
    before === undefined ? null : traceForward(index, origins, { from: before }),
    after === undefined ? null : traceForward(index, origins, { from: after }),
    traceForward(index, origins, { at: endAt, from: before }),
    traceHolder(index, holder.id, { from: covering(index.moves.length) }),
  ];
  for (const a of answers) hash.update(JSON.stringify(a));
  n += answers.length;
}
for (let pos = 1000; pos < index.moves.length; pos += Math.floor(index.moves.length / 40)) {
  const m = index.moves[pos];
  if (m === undefined) continue;
  hash.update(JSON.stringify(traceMove(index, m.id, { from: covering(pos - 500) })));
  hash.update(JSON.stringify(traceHolder(index, m.toHolderId, { at: m.at, from: covering(pos - 2000) })));
  n += 2;
}
console.log(`years ${years} snapshots ${snaps.length} answers ${n} digest ${hash.digest("hex").slice(0, 24)}`);
