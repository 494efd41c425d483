// The answers kept as sent (lib/api/answer-bytes.ts): bounded by bytes, the least recently asked
// question dropped first, an answer over the per-answer limit sent but never kept.
import { describe, expect, it } from "vitest";
import { AnswerBytes } from "@/lib/api/answer-bytes";

const bytes = (n: number, fill = 1) => new Uint8Array(n).fill(fill);

describe("AnswerBytes", () => {
  it("hands back the same bytes for the same tag and nothing for another", () => {
    const kept = new AnswerBytes(100, 50);
    const body = bytes(10, 7);
    kept.set('W/"1.5.9.a"', body);
    expect(kept.get('W/"1.5.9.a"')).toBe(body);
    expect(kept.get('W/"1.6.9.a"')).toBeUndefined();
    expect(kept.bytes).toBe(10);
  });

  it("drops the least recently asked answers once the total passes the bound", () => {
    const kept = new AnswerBytes(100, 50);
    kept.set("a", bytes(40));
    kept.set("b", bytes(40));
    kept.get("a"); // a is now the most recently asked
    kept.set("c", bytes(40));
    expect(kept.get("b")).toBeUndefined();
    expect(kept.get("a")).toBeDefined();
    expect(kept.get("c")).toBeDefined();
    expect(kept.bytes).toBe(80);
    expect(kept.size).toBe(2);
  });

  it("never keeps an answer larger than the per-answer limit, and a replaced tag's old bytes stop counting", () => {
    const kept = new AnswerBytes(100, 50);
    kept.set("big", bytes(51));
    expect(kept.get("big")).toBeUndefined();
    expect(kept.bytes).toBe(0);
    kept.set("a", bytes(30));
    kept.set("a", bytes(20, 2));
    expect(kept.bytes).toBe(20);
    expect(kept.get("a")?.[0]).toBe(2);
    kept.set("a", bytes(60));
    expect(kept.get("a")).toBeUndefined();
    expect(kept.bytes).toBe(0);
    kept.set("b", bytes(5));
    kept.clear();
    expect([kept.size, kept.bytes]).toEqual([0, 0]);
  });
});
