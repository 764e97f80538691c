/** A seeded synthetic diary for benchmarks and size tests (not the example diary). */
const DAY = 86_400_000;
export const BENCH_TAGS = ['client:norrowby', 'client:wendlebrook', 'renewals', 'procurement', 'regulation', 'delivery', 'hiring', 'pricing'];
const TAGS = BENCH_TAGS;

export function mulberry32(seed: number): () => number {
  let a = seed >>> 0;
  return () => {
    a = (a + 0x6d2b79f5) >>> 0;
    let t = a;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4294967296;
  };
}

/**
 * A synthetic diary of `questions` questions with `revisionsPerQuestion` revisions each, from a
 * seeded PRNG (same arguments, same file). For benchmarks and size tests only.
 *
 * `firstIndex` numbers the questions from there (ids `bench-<index>`) and seeds the PRNG with
 * it, so a large diary can be written as several files that import one after another.
 */
export function buildDiaryFile(questions: number, revisionsPerQuestion = 20, firstIndex = 0): { format: string; version: number; questions: object[] } {
  return { format: 'forelog-diary', version: 1, questions: [...diaryQuestions(questions, revisionsPerQuestion, firstIndex)] };
}

/** The question records of `buildDiaryFile`, one at a time, for diaries too large to hold whole. */
export function* diaryQuestions(questions: number, revisionsPerQuestion = 20, firstIndex = 0): Generator<object> {
  const rand = mulberry32(20261201 + firstIndex);
  const start = Date.UTC(2021, 0, 4);
  const perQuestion = revisionsPerQuestion;
  for (let i = firstIndex; i < firstIndex + questions; i++) {
    const opened = start + Math.floor(rand() * 1500) * DAY;
    const closes = opened + (14 + Math.floor(rand() * 160)) * DAY;
    const truth = rand();
    const forecasts = [];
    for (let j = 0; j < perQuestion; j++) {
      const at = opened + Math.floor(((j + rand()) / perQuestion) * (closes - opened));
      forecasts.push({ at: new Date(at).toISOString(), p: Math.round(Math.min(1, Math.max(0, truth + (rand() - 0.5) * 0.5)) * 100) / 100, note: '' });
    }
    const roll = rand();
    yield {
      id: `bench-${i}`,
      title: `Synthetic question ${i}`,
      kind: roll < 0.7 ? 'event_by_deadline' : 'state_at_deadline',
      tags: [TAGS[i % TAGS.length]!, TAGS[(i * 7 + 3) % TAGS.length]!].filter((t, k, a) => a.indexOf(t) === k),
      opened_at: new Date(opened).toISOString(),
      closes_at: new Date(closes).toISOString(),
      time_zone: 'Europe/London',
      base_rate: Math.round(rand() * 100) / 100,
      forecasts,
      references: i % 5 === 0 ? [{ at: new Date(opened + DAY).toISOString(), p: 0.5, source: 'sector survey' }] : [],
      resolution: roll < 0.9 ? { outcome: rand() < truth ? 'yes' : 'no', at: new Date(closes).toISOString(), note: '' } : null,
    };
  }
}

const LEVEL_SETS = [[0.1, 0.5, 0.9], [0.05, 0.25, 0.5, 0.75, 0.95], [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95]];
const isoDate = (ms: number) => new Date(ms).toISOString().slice(0, 10);

/**
 * A mixed synthetic diary: of every three questions one yes/no (as `diaryQuestions` makes
 * them), one choice with 2–12 options (every other one ordered, every third with option base
 * rates) and one numeric (three level sets; every fourth valued in dates). Seeded from
 * `firstIndex` like `buildDiaryFile`; 90 % resolved, 5 % of those void.
 */
export function buildMixedDiaryFile(questions: number, revisionsPerQuestion = 20, firstIndex = 0): { format: string; version: number; questions: object[] } {
  return { format: 'forelog-diary', version: 1, questions: [...mixedDiaryQuestions(questions, revisionsPerQuestion, firstIndex)] };
}

export function* mixedDiaryQuestions(questions: number, revisionsPerQuestion = 20, firstIndex = 0): Generator<object> {
  const rand = mulberry32(20261202 + firstIndex);
  const binary = diaryQuestions(questions, revisionsPerQuestion, firstIndex);
  const start = Date.UTC(2021, 0, 4);
  for (let i = firstIndex; i < firstIndex + questions; i++) {
    const yesNo = binary.next().value as Record<string, unknown>;
    if (i % 3 === 0) {
      yield yesNo;
      continue;
    }
    const opened = start + Math.floor(rand() * 1500) * DAY;
    const closes = opened + (14 + Math.floor(rand() * 160)) * DAY;
    const times = Array.from({ length: revisionsPerQuestion }, (_, j) => new Date(opened + Math.floor(((j + rand()) / revisionsPerQuestion) * (closes - opened))).toISOString());
    const roll = rand();
    const resolvedAt = new Date(closes).toISOString();
    const common = {
      id: `bench-${i}`,
      title: `Synthetic ${i % 3 === 1 ? 'choice' : 'numeric'} question ${i}`,
      kind: 'event_by_deadline',
      tags: [TAGS[i % TAGS.length]!, TAGS[(i * 7 + 3) % TAGS.length]!].filter((t, k, a) => a.indexOf(t) === k),
      opened_at: new Date(opened).toISOString(),
      closes_at: new Date(closes).toISOString(),
      time_zone: 'Europe/London',
    };
    if (i % 3 === 1) {
      const K = 2 + Math.floor(rand() * 11);
      // Whole percentages that sum to exactly 100, so every vector sums to 1 within 1e-6.
      const vector = () => {
        const raw = Array.from({ length: K }, () => 1 + Math.floor(rand() * 20));
        const total = raw.reduce((s, x) => s + x, 0);
        const pct = raw.map((x) => Math.floor((x / total) * 100));
        pct[0]! += 100 - pct.reduce((s, x) => s + x, 0);
        return pct.map((x) => x / 100);
      };
      yield {
        type: 'choice',
        ...common,
        options: Array.from({ length: K }, (_, k) => `Option ${k + 1}`),
        ordered: i % 2 === 0,
        ...(i % 9 === 1 ? { option_base_rates: vector() } : {}),
        forecasts: times.map((at) => ({ at, probs: vector(), note: '' })),
        references: i % 5 === 0 ? [{ at: common.opened_at, probs: vector(), source: 'sector survey' }] : [],
        resolution: roll < 0.9 ? (roll < 0.045 ? { outcome: 'void', at: resolvedAt, note: '' } : { outcome: 'option', option: Math.floor(rand() * K), at: resolvedAt, note: '' }) : null,
      };
      continue;
    }
    const levels = LEVEL_SETS[i % LEVEL_SETS.length]!;
    const dates = i % 4 === 2;
    const centre = dates ? Math.floor(closes / DAY) + Math.floor(rand() * 60) : Math.floor(rand() * 200);
    const value = (x: number) => (dates ? isoDate(Math.round(x) * DAY) : Math.round(x * 10) / 10);
    const quantiles = () => {
      const spread = 1 + rand() * 30;
      return levels.map((tau) => value(centre + (tau - 0.5) * 2 * spread));
    };
    yield {
      type: 'numeric',
      ...common,
      unit: dates ? '' : 'weeks',
      value_kind: dates ? 'date' : 'number',
      levels,
      forecasts: times.map((at) => ({ at, quantiles: quantiles(), note: '' })),
      references: i % 5 === 0 ? [{ at: common.opened_at, quantiles: quantiles(), source: 'sector survey' }] : [],
      resolution: roll < 0.9 ? (roll < 0.045 ? { outcome: 'void', at: resolvedAt, note: '' } : { outcome: 'value', value: value(centre + (rand() - 0.5) * 80), at: resolvedAt, note: '' }) : null,
    };
  }
}
