// A plausible posted part program of a given length, for the benchmark and the streaming test.

/** About `lines` lines of a plausible posted program, tool segments of equal length. */
export function generatePartProgram(lines: number): string {
  const out = ['%', 'O2000 (BENCH PART)', 'G20 G17 G40 G49 G80 G90 G94', 'G54'];
  const perTool = Math.floor((lines - 8) / 4);
  for (let t = 1; t <= 4; t++) {
    out.push(`T${t} M6`, 'S8000 M3', 'G0 X0.1 Y0.1', `G43 H${t} Z0.5`, 'M8');
    let n = 5;
    if (t === 3) {
      out.push('G98 G81 X0.2 Y0.2 Z-0.3 R0.1 F10.');
      for (; n < perTool - 4; n++) out.push(`X${(0.2 + (n % 40) * 0.02).toFixed(4)} Y${(0.2 + Math.floor(n / 40) % 40 * 0.02).toFixed(4)}`);
      out.push('G80');
    } else {
      out.push('G1 Z-0.05 F20.');
      for (; n < perTool - 4; n += 4) {
        const x = 0.1 + (n % 200) * 0.005;
        out.push(`G1 X${(x + 0.2).toFixed(4)} Y0.1`, `G3 X${(x + 0.4).toFixed(4)} Y0.3 I0. J0.2`, 'G91 G1 X-0.05 Y0.05', 'G90 G1 Y0.1');
      }
    }
    out.push('G0 Z0.5', 'M9', 'G91 G28 Z0', 'G90');
  }
  out.push('M30', '%');
  return out.join('\n') + '\n';
}
