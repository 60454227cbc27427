import type { Lane } from '../schemas/burn';
import type { Rule, RuleKind } from './types';

export type SpecimenResult = {
  charLengthMm: number | null;
  afterflameS: number | null;
  /** False when the afterflame was still going when timing ended: afterflameS is a lower bound. */
  afterflameComplete: boolean;
  afterglowS: number | null;
  flamingDrips: boolean | null;
  massLossPct: number | null;
  burnedToClamp: boolean;
  /** Total burn time after the flame was removed; the burn rate divides the char length by it. */
  burnTimeS: number | null;
};

export type RuleVerdict = {
  rule: Rule;
  pass: boolean;
  /**
   * The figure judged: the highest value for an 'each' rule, the mean for an 'average' rule, the
   * number of specimens that showed it for a yes/no rule; null when it could not be worked out.
   */
  value: number | null;
  limit?: number;
  reason: string;
};

export type Judgement = {
  pass: boolean;
  verdicts: RuleVerdict[];
  /** One plain sentence per rule that did not pass, naming the rule. */
  failed: string[];
  /** Set when there are fewer specimens than the profile asks for; the set then does not pass. */
  notEnough?: string;
};

type Profile = { minSpecimens: number; rules: Rule[] };

type Measure = {
  noun: string;
  unit: string;
  /**
   * The specimen's value; `lowerBound` when the true value may be higher, `missing` naming what
   * was not recorded. A value with `missing` is a partial sum, itself a lower bound.
   */
  read: (r: SpecimenResult) => { value: number | null; lowerBound: boolean; missing?: string };
};

const plain = (value: number | null, missing: string) =>
  value === null ? { value: null, lowerBound: false, missing } : { value, lowerBound: false };

const measures: Record<Exclude<RuleKind, 'no_flaming_drips' | 'no_burn_to_clamp'>, Measure> = {
  max_char_length_mm: {
    noun: 'char length',
    unit: 'mm',
    read: (r) => plain(r.charLengthMm, 'char length'),
  },
  max_afterflame_s: {
    noun: 'afterflame',
    unit: 's',
    read: (r) =>
      r.afterflameS === null
        ? { value: null, lowerBound: false, missing: 'afterflame time' }
        : { value: r.afterflameS, lowerBound: !r.afterflameComplete },
  },
  max_afterglow_s: {
    noun: 'afterglow',
    unit: 's',
    read: (r) => plain(r.afterglowS, 'afterglow time'),
  },
  max_mass_loss_pct: {
    noun: 'mass loss',
    unit: '%',
    read: (r) => plain(r.massLossPct, 'mass loss'),
  },
  max_burn_rate_mm_per_min: {
    noun: 'burn rate',
    unit: 'mm/min',
    read: (r) => {
      if (r.charLengthMm === null) return plain(null, 'char length');
      // Nothing charred means the flame front did not travel, whatever the clock says.
      if (r.charLengthMm === 0) return plain(0, '');
      if (r.burnTimeS === null || r.burnTimeS <= 0) return plain(null, 'burn time');
      return plain(r.charLengthMm / (r.burnTimeS / 60), '');
    },
  },
  max_afterflame_plus_afterglow_s: {
    noun: 'afterflame plus afterglow',
    unit: 's',
    read: (r) => {
      if (r.afterflameS === null) return plain(null, 'afterflame time');
      const lowerBound = !r.afterflameComplete;
      if (r.afterglowS === null) {
        return { value: r.afterflameS, lowerBound: true, missing: 'afterglow time' };
      }
      return { value: r.afterflameS + r.afterglowS, lowerBound };
    },
  },
};

const yesNo = {
  no_flaming_drips: {
    label: 'No flaming drips',
    read: (r: SpecimenResult) => r.flamingDrips,
    seen: 'flaming drips',
    missing: 'flaming-drip record',
  },
  no_burn_to_clamp: {
    label: 'No burn to the clamp',
    read: (r: SpecimenResult) => r.burnedToClamp,
    seen: 'a burn to the clamp',
    missing: 'burn-to-clamp record',
  },
} as const;

const limitLabels: Record<keyof typeof measures, string> = {
  max_char_length_mm: 'Char length',
  max_afterflame_s: 'Afterflame',
  max_afterglow_s: 'Afterglow',
  max_mass_loss_pct: 'Mass loss',
  max_burn_rate_mm_per_min: 'Burn rate',
  max_afterflame_plus_afterglow_s: 'Afterflame plus afterglow',
};

const isYesNo = (kind: RuleKind): kind is keyof typeof yesNo => kind in yesNo;

/** Two decimals at most, without trailing zeros: 101.6, 15, 0.33. */
const fmt = (n: number) => String(Math.round(n * 100) / 100);
const quantity = (n: number, unit: string) => `${fmt(n)} ${unit}`;
const specimens = (n: number) => `${n} specimen${n === 1 ? '' : 's'}`;
/** "specimen 2", "specimens 1 and 3", "specimens 1, 2 and 4" */
function which(numbers: number[]): string {
  if (numbers.length === 1) return `specimen ${numbers[0]}`;
  return `specimens ${numbers.slice(0, -1).join(', ')} and ${numbers[numbers.length - 1]}`;
}

// Limits are inclusive; the margin keeps a mean such as (101.6 × 3) / 3 from failing on rounding.
const within = (value: number, limit: number) => value <= limit + 1e-9 * Math.max(1, limit);

/** The rule in plain words, e.g. "Char length at most 152 mm (average)". */
export function ruleLabel(rule: Rule): string {
  const scope = rule.appliesTo === 'average' ? 'average' : 'each specimen';
  if (isYesNo(rule.kind)) return `${yesNo[rule.kind].label} (each specimen)`;
  const measure = measures[rule.kind];
  const limit = rule.limit === undefined ? 'a limit not set' : quantity(rule.limit, measure.unit);
  return `${limitLabels[rule.kind]} at most ${limit} (${scope})`;
}

function judgeYesNo(rule: Rule, kind: keyof typeof yesNo, results: SpecimenResult[]): RuleVerdict {
  const spec = yesNo[kind];
  const seen: number[] = [];
  const missing: number[] = [];
  results.forEach((r, i) => {
    const v = spec.read(r);
    if (v === null) missing.push(i + 1);
    else if (v) seen.push(i + 1);
  });
  const value = seen.length;
  if (seen.length > 0) {
    return { rule, pass: false, value, reason: `${spec.seen} on ${which(seen)}` };
  }
  if (missing.length > 0) {
    return { rule, pass: false, value, reason: `missing ${spec.missing} for ${which(missing)}` };
  }
  return {
    rule,
    pass: true,
    value,
    reason: `none of ${specimens(results.length)} showed ${spec.seen}`,
  };
}

function judgeEach(
  rule: Rule,
  measure: Measure,
  limit: number,
  results: SpecimenResult[],
): RuleVerdict {
  const readings = results.map((r, i) => ({ n: i + 1, ...measure.read(r) }));
  const known = readings.filter((x): x is typeof x & { value: number } => x.value !== null);
  const highest = known.reduce<number | null>(
    (m, x) => (m === null ? x.value : Math.max(m, x.value)),
    null,
  );
  const verdict = (pass: boolean, reason: string): RuleVerdict => ({
    rule,
    pass,
    value: highest,
    limit,
    reason,
  });

  // A lower bound or a partial sum above the limit already fails: the true value is higher still.
  const over = readings.filter((x) => x.value !== null && !within(x.value, limit));
  if (over.length > 0) {
    const parts = over.map(
      (x) =>
        `specimen ${x.n}: ${x.lowerBound ? 'at least ' : ''}${quantity(x.value ?? 0, measure.unit)}`,
    );
    return verdict(false, `over ${quantity(limit, measure.unit)} (${parts.join('; ')})`);
  }
  const missing = readings.filter((x) => x.missing !== undefined);
  if (missing.length > 0) {
    const what = [...new Set(missing.map((x) => x.missing))].join(' or ');
    return verdict(false, `missing ${what} for ${which(missing.map((x) => x.n))}`);
  }
  const bounded = readings.filter((x) => x.lowerBound);
  if (bounded.length > 0) {
    return verdict(
      false,
      `not judged: afterflame only known as a lower bound (${which(bounded.map((x) => x.n))})`,
    );
  }
  const top = known.find((x) => x.value === highest);
  return verdict(
    true,
    `all ${specimens(results.length)} within the limit; highest ${quantity(highest ?? 0, measure.unit)}` +
      (top && results.length > 1 ? ` (specimen ${top.n})` : ''),
  );
}

function judgeAverage(
  rule: Rule,
  measure: Measure,
  limit: number,
  results: SpecimenResult[],
): RuleVerdict {
  const readings = results.map((r, i) => ({ n: i + 1, ...measure.read(r) }));
  const noValue = readings.filter((x) => x.value === null);
  if (noValue.length > 0) {
    const what = [...new Set(noValue.map((x) => x.missing))].join(' or ');
    return {
      rule,
      pass: false,
      value: null,
      limit,
      reason: `missing ${what} for ${which(noValue.map((x) => x.n))}; the average needs every specimen`,
    };
  }
  const mean = readings.reduce((sum, x) => sum + (x.value ?? 0), 0) / readings.length;
  const uncertain = readings.filter((x) => x.lowerBound || x.missing !== undefined);
  const verdict = (pass: boolean, reason: string): RuleVerdict => ({
    rule,
    pass,
    value: mean,
    limit,
    reason,
  });
  const average = `average ${uncertain.length > 0 ? 'at least ' : ''}${quantity(mean, measure.unit)}`;
  if (!within(mean, limit)) {
    return verdict(
      false,
      `${average} of ${specimens(results.length)}, over ${quantity(limit, measure.unit)}`,
    );
  }
  const missing = readings.filter((x) => x.missing !== undefined);
  if (missing.length > 0) {
    const what = [...new Set(missing.map((x) => x.missing))].join(' or ');
    return verdict(
      false,
      `missing ${what} for ${which(missing.map((x) => x.n))}; the average needs every specimen`,
    );
  }
  if (uncertain.length > 0) {
    return verdict(
      false,
      `not judged: afterflame only known as a lower bound (${which(uncertain.map((x) => x.n))}); ${average}`,
    );
  }
  return verdict(true, `${average} of ${specimens(results.length)}, within the limit`);
}

function judgeRule(rule: Rule, results: SpecimenResult[]): RuleVerdict {
  // A yes/no rule asked for 'average' would have no sensible meaning; the schema refuses it, and
  // an unchecked profile gets the stricter per-specimen reading.
  const limit = rule.limit === undefined ? {} : { limit: rule.limit };
  if (results.length === 0) {
    return { rule, pass: false, value: null, ...limit, reason: 'missing results: no specimens' };
  }
  if (isYesNo(rule.kind)) return judgeYesNo(rule, rule.kind, results);
  const measure = measures[rule.kind];
  if (rule.limit === undefined) {
    return { rule, pass: false, value: null, reason: 'not judged: the rule has no limit' };
  }
  return rule.appliesTo === 'average'
    ? judgeAverage(rule, measure, rule.limit, results)
    : judgeEach(rule, measure, rule.limit, results);
}

const capitalise = (s: string) => s.charAt(0).toUpperCase() + s.slice(1);

/**
 * Judge a set of specimens against a profile. A rule that cannot be judged (a value missing, an
 * afterflame known only as a lower bound under the limit) does not pass. Limits are inclusive.
 */
export function judgeSpecimens(profile: Profile, results: SpecimenResult[]): Judgement {
  const verdicts = profile.rules.map((rule) => judgeRule(rule, results));
  const failed = verdicts.filter((v) => !v.pass).map((v) => `${ruleLabel(v.rule)} — ${v.reason}.`);
  const notEnough =
    results.length < profile.minSpecimens
      ? `${capitalise(specimens(results.length))} given; this profile needs at least ${profile.minSpecimens}.`
      : undefined;
  return {
    pass: notEnough === undefined && failed.length === 0,
    verdicts,
    failed,
    ...(notEnough === undefined ? {} : { notEnough }),
  };
}

/**
 * A lane of a burn pair as a specimen result. A flaming drip marked on the timer counts even when
 * the measurement says none; without drip marks the measurement decides, and without it the drips
 * are unknown.
 */
export function specimenResultFromLane(lane: Lane): SpecimenResult {
  const { derived, measurement } = lane;
  const seconds = (ms: number | null) => (ms === null ? null : ms / 1000);
  return {
    charLengthMm: measurement?.charLengthMm ?? null,
    afterflameS: seconds(derived.afterflameMs),
    afterflameComplete: derived.afterflameComplete,
    afterglowS: seconds(derived.afterglowMs),
    flamingDrips: derived.flamingDrips > 0 ? true : (measurement?.flamingDrips ?? null),
    massLossPct: measurement?.massLossPct ?? null,
    burnedToClamp: derived.burnedToClamp,
    burnTimeS: seconds(derived.totalMs),
  };
}
