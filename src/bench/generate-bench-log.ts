/**
 * A deterministic benchmark log in the settle-block format: one header line and 7 value lines per
 * iteration (5 residuals, 2 monitored quantities), about 48 bytes a line on average, so 16 million
 * lines make about 800 MB, as the issue asks. Values come from a smooth geometric decay with a deterministic wobble (an LCG), so every byte is the same on every run.
 * Invented data, for timing only.
 */
import { createWriteStream } from 'node:fs';
import { once } from 'node:events';

const RESIDUALS = ['res_p', 'res_ux', 'res_uy', 'res_k', 'res_T'];
const QUANTITIES = ['drag', 'dp'];
/** Width of the value column: sized so the file comes out near 50 bytes a line. */
const VALUE_WIDTH = 28;

export async function generateBenchLog(path: string, targetLines: number): Promise<{ lines: number; bytes: number }> {
  const out = createWriteStream(path);
  let seed = 12345;
  const wobble = (): number => {
    seed = (seed * 1103515245 + 12345) >>> 0;
    return (seed / 4294967296 - 0.5) * 0.2;
  };
  let lines = 0;
  let bytes = 0;
  let chunk = '';
  for (let iteration = 1; lines < targetLines; iteration++) {
    let block = `=== iteration ${iteration} ===\n`;
    for (let k = 0; k < RESIDUALS.length; k++) {
      const value = Math.pow(10, -iteration * (1 + k) / 400_000) * (1 + wobble());
      block += `  residual  ${RESIDUALS[k].padEnd(10)}${value.toExponential(6).padStart(VALUE_WIDTH)}\n`;
    }
    block += `  monitor   ${QUANTITIES[0].padEnd(10)}${(0.3312 + 0.01 / Math.sqrt(iteration) + wobble() * 1e-3).toFixed(8).padStart(VALUE_WIDTH)}  [-]\n`;
    block += `  monitor   ${QUANTITIES[1].padEnd(10)}${(120.4 + 5 / Math.sqrt(iteration) + wobble()).toFixed(6).padStart(VALUE_WIDTH)}  [Pa]\n`;
    lines += 8;
    chunk += block;
    if (chunk.length > 1 << 20) {
      bytes += Buffer.byteLength(chunk);
      if (!out.write(chunk)) await once(out, 'drain');
      chunk = '';
    }
  }
  bytes += Buffer.byteLength(chunk);
  out.end(chunk);
  await once(out, 'finish');
  return { lines, bytes };
}
