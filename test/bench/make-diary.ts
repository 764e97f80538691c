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
