// Loads the demo plant once per run into the template every journey copies (plant.ts).
import { spawnSync } from "node:child_process";
import { existsSync, rmSync } from "node:fs";
import { ROOT } from "../../scripts/app-server";
import { DEMO_ANCHOR, templateFile } from "./plant";

export default function globalSetup(): () => void {
  const file = templateFile();
  for (const suffix of ["", "-wal", "-shm"]) rmSync(`${file}${suffix}`, { force: true });
  const seeded = spawnSync(process.execPath, ["--conditions=react-server", "--import", "tsx", "seeds/load.ts"], {
    cwd: ROOT,
    env: { ...process.env, DATABASE_URL: `file:${file}`, DEMO_ANCHOR },
    stdio: ["ignore", "inherit", "inherit"],
  });
  if (seeded.status !== 0 || !existsSync(file)) throw new Error(`loading the demo plant into ${file} failed`);
  return () => {
    for (const suffix of ["", "-wal", "-shm"]) rmSync(`${file}${suffix}`, { force: true });
  };
}
