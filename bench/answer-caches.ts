// What a restarted server process has lost: every answer and index kept in memory. The rows stored in
// the database (TraceSnapshot) stay.
import { clearTraceCache } from "@/lib/trace/trace.service";
import { clearBalanceCache } from "@/lib/mass-balance/balance-cache.service";
import { clearCarriedBooks } from "@/lib/mass-balance/carried-books.service";
import { clearRecallCache } from "@/lib/trace/recall-cache.service";
import { clearWasteDueCache } from "@/app/waste/due/due-report-cache";

export function clearAnswerCaches(): void {
  clearTraceCache();
  clearBalanceCache();
  clearCarriedBooks();
  clearRecallCache();
  clearWasteDueCache();
}
