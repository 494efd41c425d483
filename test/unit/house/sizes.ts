// Measures files and functions for the size limits (used by size-limits.test.ts and, to record the
// exceptions once, by `node --import tsx test/unit/house/sizes.ts > test/unit/house/size-baseline.json`).
import { readdirSync, readFileSync, statSync, writeSync } from "node:fs";
import { join } from "node:path";
import { fileURLToPath } from "node:url";
import ts from "typescript";

export const ROOT = fileURLToPath(new URL("../../..", import.meta.url));
export const MAX_FILE_LINES = 400;
export const MAX_FUNCTION_LINES = 80;
/** Generated code and data tables, which are long by nature. */
const EXEMPT = [/^lib\/generated\//, /^lib\/api\/client\/openapi-types\.ts$/, /^lib\/spec\/editions\//, /\.data\.ts$/];

function sourceFiles(dir: string): string[] {
  return readdirSync(join(ROOT, dir)).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(join(ROOT, path)).isDirectory()) return sourceFiles(path);
    return /\.(ts|tsx)$/.test(name) && !name.endsWith(".d.ts") ? [path] : [];
  });
}

export const files = [...sourceFiles("lib"), ...sourceFiles("app")].filter((f) => !EXEMPT.some((r) => r.test(f)));
export const lineCount = (text: string) => text.split("\n").length - (text.endsWith("\n") ? 1 : 0);

export interface Fn {
  name: string;
  lines: number;
}

/** Every function-like node with its line count, named by its declaration or the variable it is bound to. */
export function functionsOf(path: string, text: string): Fn[] {
  const sf = ts.createSourceFile(
    path,
    text,
    ts.ScriptTarget.Latest,
    true,
    path.endsWith(".tsx") ? ts.ScriptKind.TSX : ts.ScriptKind.TS,
  );
  const out: Fn[] = [];
  const names: string[] = [];
  const visit = (node: ts.Node) => {
    let pushed = false;
    if (
      ts.isFunctionDeclaration(node) ||
      ts.isMethodDeclaration(node) ||
      ts.isArrowFunction(node) ||
      ts.isFunctionExpression(node)
    ) {
      const start = sf.getLineAndCharacterOfPosition(node.getStart(sf)).line;
      const end = sf.getLineAndCharacterOfPosition(node.getEnd()).line;
      const parent = node.parent;
      const name =
        (ts.isFunctionDeclaration(node) || ts.isMethodDeclaration(node)) && node.name
          ? node.name.getText(sf)
          : parent && ts.isVariableDeclaration(parent)
            ? parent.name.getText(sf)
            : `${names.at(-1) ?? "module"}>callback`;
      out.push({ name, lines: end - start + 1 });
      names.push(name);
      pushed = true;
    }
    ts.forEachChild(node, visit);
    if (pushed) names.pop();
  };
  visit(sf);
  return out;
}

/** The current exceptions, as the baseline file holds them. */
export function measureExceptions(): { files: Record<string, number>; functions: Record<string, number> } {
  const out = { files: {} as Record<string, number>, functions: {} as Record<string, number> };
  for (const f of files) {
    const text = readFileSync(join(ROOT, f), "utf8");
    const n = lineCount(text);
    if (n > MAX_FILE_LINES) out.files[f] = n;
    for (const fn of functionsOf(f, text)) {
      const key = `${f}#${fn.name}`;
      if (fn.lines > MAX_FUNCTION_LINES) out.functions[key] = Math.max(out.functions[key] ?? 0, fn.lines);
    }
  }
  return out;
}

if (process.argv[1]?.endsWith("sizes.ts")) writeSync(1, `${JSON.stringify(measureExceptions(), null, 2)}\n`);
