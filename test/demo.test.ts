import { afterAll, describe, expect, it } from "vitest";
import { existsSync, mkdtempSync, readFileSync, rmSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { main } from "../src/cli/main.js";

const dir = mkdtempSync(join(tmpdir(), "septum-demo-"));
afterAll(() => rmSync(dir, { recursive: true, force: true }));

describe("demo", () => {
  it("runs end to end on a coarse mesh: says it is illustrative, balances the heat, converges at rate ≈ 2, writes both pictures", () => {
    let out = "";
    const code = main(["demo", "--size", "3", "-o", "out", "--quiet"], {
      stdout: (s) => (out += s), stderr: () => {}, stderrIsTTY: false, cwd: dir, now: () => performance.now() / 1000,
    });
    expect(code).toBe(0);
    expect(out).toContain("ILLUSTRATIVE SCENARIO WITH INVENTED DATA");
    for (const o of ["nested-dissection", "minimum-degree", "reverse-cuthill-mckee", "natural"]) expect(out).toContain(o);
    // conservation: the heat deposited by the cells leaves through the channels (steady state, insulated rim)
    const m = out.match(/Heat balance: ([\d.]+) W deposited \(nominal (\d+) W.*?\), ([\d.]+) W leave/);
    expect(m).not.toBeNull();
    const [load, nominal, outflow] = [Number(m![1]), Number(m![2]), Number(m![3])];
    expect(Math.abs(load - outflow)).toBeLessThan(2e-3); // printed to 3 decimals
    expect(Math.abs(load - nominal)).toBeLessThan(0.05 * nominal); // quadrature of the patch edges, O(h) of the patch size
    expect(existsSync(join(dir, "out/report.html"))).toBe(true);
    expect(readFileSync(join(dir, "out/temperature.svg"), "utf8")).toContain("linearGradient");
    // the printed refinement study, solved by septum: observed L2 rates ≈ 2 (P1 is O(h²) in L2, common practice)
    const rates = [...out.matchAll(/^\s*[\d.]+\s+[\d ]+\s+[\d.]+e-\d+\s+([\d.]+)$/gm)].map((r) => Number(r[1]));
    expect(rates.length).toBe(2);
    for (const r of rates) {
      expect(r).toBeGreaterThan(1.8);
      expect(r).toBeLessThan(2.2);
    }
  });
});
