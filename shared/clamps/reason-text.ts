import type { StockCheckReason } from '../schemas/stock-check';

/**
 * One wording for the stock check, shared by the UI and the printed setup sheet. Plain trade words;
 * each refusal says what is wrong and what it risks.
 */
export const REASON_TEXT: Readonly<Record<StockCheckReason, string>> = {
  'too-narrow': 'bar narrower than the clamp accepts — will not fit',
  'too-wide': 'bar wider than the clamp accepts — will not fit',
  'thinner-than-carrier': 'bar no thicker than the carrier — nothing left to machine, and the clamp stands above it',
  'clamp-above-carrier': 'clamp top above the carrier less clearance — collision risk',
  'short-bite': 'bite on the flat face below the minimum — pull-out risk',
};

/** For a bar that no rail setting within the slot slop accepts. */
export const UNPLACEABLE_TEXT = 'no rail setting within the slot slop holds this bar — set it aside';

/** Shown with every stock-check result that calls a bar or a setting fine. */
export const STOCK_CHECK_ADVICE =
  'Advice only, worked out from the measured sizes, the clamp model and the job entered. ' +
  "Check every clamp by hand before cycle start, follow the machine builder's instructions, " +
  'and defer to local codes and licensed practice.';

/** The printed load list's advice line: the same caution, said of the paper the operator loads by. */
export const LOAD_LIST_ADVICE =
  'A load list is advice, worked out from the measured bars, the clamp model and the job entered. ' +
  'The operator checks every clamp before cycle start, follows the machine builder’s instructions, ' +
  'and defers to local codes and licensed practice.';

export function reasonText(code: StockCheckReason): string {
  return REASON_TEXT[code];
}

/** The reasons of one bar as one line, e.g. for a setup-sheet cell; "accepted" when there are none. */
export function reasonsLine(codes: readonly StockCheckReason[]): string {
  return codes.length === 0 ? 'accepted' : codes.map(reasonText).join('; ');
}
