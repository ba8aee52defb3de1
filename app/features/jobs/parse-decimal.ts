// A plain decimal as typed: 1, -10.5, .5. No exponents or grouping commas, which a drawing
// coordinate never needs and a typo often produces.
const DECIMAL = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)$/;

export function parseDecimal(text: string): number | null {
  const t = text.trim();
  if (!DECIMAL.test(t)) return null;
  const v = Number(t);
  return Number.isFinite(v) ? v : null;
}
