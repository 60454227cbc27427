import type { TreatmentPairOutput } from '../../shared/schemas/treatment';

/** Pairs with both char lengths measured: the only ones the charts (and the statistics) use. */
function measured(pairs: TreatmentPairOutput[]) {
  return pairs.flatMap((p, i) =>
    p.control.charLengthMm !== null && p.treated.charLengthMm !== null
      ? [{ number: i + 1, control: p.control.charLengthMm, treated: p.treated.charLengthMm }]
      : [],
  );
}

export type PairLines = {
  /** Two rows, x = 0 (control) and x = 1 (treated); one y key per pair. */
  rows: Record<string, number>[];
  keys: string[];
  top: number;
};

/**
 * For each pair a line from its control char length to its treated one. Each pair is its own
 * series of two points, so the chart library draws one line per pair.
 */
export function pairLines(pairs: TreatmentPairOutput[]): PairLines {
  const list = measured(pairs);
  const keys = list.map((_, i) => `p${i}`);
  const control: Record<string, number> = { x: 0 };
  const treated: Record<string, number> = { x: 1 };
  list.forEach((p, i) => {
    control[keys[i]!] = p.control;
    treated[keys[i]!] = p.treated;
  });
  const top = Math.max(10, ...list.flatMap((p) => [p.control, p.treated])) * 1.1;
  return { rows: [control, treated], keys, top };
}

export type DifferenceDots = {
  /** x = the pair's number in the list (oldest first); diff = control − treated (mm). */
  dots: { x: number; diff: number }[];
  /** Pairs in the list, measured or not: the x axis runs from 0 to count + 1. */
  count: number;
  mean: number | null;
  ci95: [number, number] | null;
  /** The y range to draw: every dot, the interval and zero, with a margin. */
  lo: number;
  hi: number;
};

export function differenceDots(
  pairs: TreatmentPairOutput[],
  difference: { mean: number | null; ci95: [number, number] | null },
): DifferenceDots {
  const dots = measured(pairs).map((p) => ({ x: p.number, diff: p.control - p.treated }));
  const values = [0, ...dots.map((d) => d.diff), ...(difference.ci95 ?? [])];
  if (difference.mean !== null) values.push(difference.mean);
  const min = Math.min(...values);
  const max = Math.max(...values);
  const margin = Math.max(5, (max - min) * 0.1);
  return {
    dots,
    count: pairs.length,
    mean: difference.mean,
    ci95: difference.ci95,
    lo: min - margin,
    hi: max + margin,
  };
}

type Format = (mm: number) => string;

/** The text alternative of the control → treated chart. */
export function pairLinesSummary(pairs: TreatmentPairOutput[], format: Format): string {
  const list = measured(pairs);
  if (!list.length) return 'No pair has both char lengths measured yet.';
  const shorter = list.filter((p) => p.treated < p.control).length;
  const range = (xs: number[]) => `${format(Math.min(...xs))} to ${format(Math.max(...xs))}`;
  return (
    `Char length of ${list.length} pair${list.length === 1 ? '' : 's'}, each a line from the ` +
    `control to the treated specimen. Controls ${range(list.map((p) => p.control))}; treated ` +
    `${range(list.map((p) => p.treated))}. The treated specimen charred less in ${shorter} of ` +
    `${list.length}.`
  );
}

/** The text alternative of the dot plot of differences. */
export function differenceSummary(d: DifferenceDots, format: Format): string {
  if (!d.dots.length) return 'No pair has both char lengths measured yet.';
  const diffs = d.dots.map((x) => x.diff);
  let text =
    `Paired differences (control − treated) of ${diffs.length} pair` +
    `${diffs.length === 1 ? '' : 's'}, from ${format(Math.min(...diffs))} to ` +
    `${format(Math.max(...diffs))}.`;
  if (d.mean !== null) text += ` Mean ${format(d.mean)}`;
  if (d.ci95) {
    const [lo, hi] = d.ci95;
    text += `, 95 % CI ${format(lo)} to ${format(hi)}`;
    text +=
      lo > 0 || hi < 0
        ? '; the interval does not include zero.'
        : '; the interval includes zero: no difference cannot be ruled out.';
  } else if (d.mean !== null) {
    text += '; too few pairs for an interval.';
  }
  return text;
}
