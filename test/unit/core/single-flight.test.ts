// One computation per question at a time (lib/core/single-flight.ts).
import { describe, expect, it } from "vitest";
import { SingleFlight } from "@/lib/core/single-flight";

function deferred<T>() {
  let resolve!: (v: T) => void;
  let reject!: (e: unknown) => void;
  const promise = new Promise<T>((res, rej) => {
    resolve = res;
    reject = rej;
  });
  return { promise, resolve, reject };
}

describe("SingleFlight", () => {
  it("runs the same question once while it is being answered, and every caller gets that answer", async () => {
    const flight = new SingleFlight<number>();
    const gate = deferred<number>();
    let runs = 0;
    const fn = () => {
      runs += 1;
      return gate.promise;
    };
    const asks = [flight.run("q@1.5.9", fn), flight.run("q@1.5.9", fn), flight.run("q@1.5.9", fn)];
    expect(flight.size).toBe(1);
    gate.resolve(42);
    const answers = await Promise.all(asks);
    expect(runs).toBe(1);
    expect(answers.map((a) => a.value)).toEqual([42, 42, 42]);
    expect(answers.map((a) => a.first)).toEqual([true, false, false]);
    expect(flight.size).toBe(0);
  });

  it("runs other questions (another position) apart, and asks again once the first answer is in", async () => {
    const flight = new SingleFlight<string>();
    let runs = 0;
    const fn = (v: string) => () => {
      runs += 1;
      return Promise.resolve(v);
    };
    const [a, b] = await Promise.all([flight.run("q@1.5.9", fn("a")), flight.run("q@1.6.9", fn("b"))]);
    expect([a.value, b.value, runs]).toEqual(["a", "b", 2]);
    expect((await flight.run("q@1.5.9", fn("c"))).value).toBe("c");
    expect(runs).toBe(3);
  });

  it("hands a failure to every waiting caller and forgets it", async () => {
    const flight = new SingleFlight<number>();
    const gate = deferred<number>();
    const asks = [flight.run("q", () => gate.promise), flight.run("q", () => gate.promise)];
    gate.reject(new Error("database gone"));
    for (const a of asks) await expect(a).rejects.toThrow("database gone");
    expect(flight.size).toBe(0);
    expect((await flight.run("q", () => Promise.resolve(7))).value).toBe(7);
  });
});
