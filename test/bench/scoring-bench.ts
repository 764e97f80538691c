/**
 * Times the scoring engine on a large synthetic diary: 10,000 questions with 200,000
 * forecasts in total, built from a seeded PRNG so every run scores the same data.
 * Prints the median of 5 runs (the first run includes JIT warm-up, as a cold
 * `forelog score` would) and the CPU time the process spent, a steadier figure when
 * other work shares the machine. Run: `npx tsx test/bench/scoring-bench.ts`.
 */
import { computeScoreReport, computeScorecardDetail, type ScoringQuestion } from '../../shared/scoring/index';
import { mulberry32 } from './make-diary';

const QUESTIONS = 10_000;
const FORECASTS_PER_QUESTION = 20; // on average; pairs of questions get 20 − d and 20 + d
const RUNS = 5;
const DAY = 86_400_000;


function buildDiary(seed: number, shuffleForecasts: boolean): ScoringQuestion[] {
  const rand = mulberry32(seed);
  const start = Date.UTC(2020, 0, 1);
  const questions: ScoringQuestion[] = [];
  let seq = 0;
  let spread = 0;
  for (let i = 0; i < QUESTIONS; i++) {
    if (i % 2 === 0) spread = Math.floor(rand() * FORECASTS_PER_QUESTION);
    const count = i % 2 === 0 ? FORECASTS_PER_QUESTION - spread : FORECASTS_PER_QUESTION + spread;
    const opened = start + Math.floor(rand() * 1500) * DAY;
    const closes = opened + (10 + Math.floor(rand() * 170)) * DAY;
    const truth = rand();
    const roll = rand();
    const resolution =
      roll < 0.15
        ? null
        : {
            outcome: roll < 0.2 ? ('void' as const) : rand() < truth ? ('yes' as const) : ('no' as const),
            at: roll < 0.6 ? closes : opened + Math.floor(rand() * (closes - opened)),
          };
    const forecasts = [];
    for (let j = 0; j < count; j++) {
      const at = opened + Math.floor(((j + rand()) / count) * (closes - opened) * 1.05);
      const p = Math.min(1, Math.max(0, Math.round((truth + (rand() - 0.5) * 0.6) * 100) / 100));
      forecasts.push({ at, p, seq: seq++ });
    }
    if (shuffleForecasts) {
      for (let j = forecasts.length - 1; j > 0; j--) {
        const k = Math.floor(rand() * (j + 1));
        [forecasts[j], forecasts[k]] = [forecasts[k]!, forecasts[j]!];
      }
    }
    questions.push({
      id: `q${i}`,
      title: `Synthetic question ${i}`,
      tags: i % 7 === 0 ? ['work'] : [],
      kind: i % 2 === 0 ? 'event_by_deadline' : 'state_at_deadline',
      closes_at: closes,
      resolution,
      base_rate: rand() < 0.5 ? Math.round(truth * 10) / 10 : null,
      costs: rand() < 0.3 ? { false_alarm: 1, miss: 1 + Math.floor(rand() * 5) } : null,
      forecasts,
      references: rand() < 0.3 ? [{ at: opened + 2 * DAY, p: truth }, { at: opened + 9 * DAY, p: 1 - truth }] : [],
    });
  }
  return questions;
}

const median = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

/**
 * Wall-clock time per run, and the process's CPU time (user + system, all threads),
 * which other programs competing for the 2 cores inflate much less than wall time.
 */
function timeRuns(fn: () => void): { median: number; runs: number[]; cpuMedian: number } {
  const runs: number[] = [];
  const cpu: number[] = [];
  for (let r = 0; r < RUNS; r++) {
    const c = process.cpuUsage();
    const t = performance.now();
    fn();
    runs.push(performance.now() - t);
    const used = process.cpuUsage(c);
    cpu.push((used.user + used.system) / 1000);
  }
  return { median: median(runs), runs, cpuMedian: median(cpu) };
}

const fmt = (ms: number) => `${ms.toFixed(1)} ms`;
const options = { default_costs: { false_alarm: 1, miss: 1 } };

for (const [label, shuffle] of [
  ['forecasts in time order', false],
  ['forecasts shuffled', true],
] as const) {
  const diary = buildDiary(42, shuffle);
  const total = diary.reduce((s, q) => s + q.forecasts.length, 0);
  let scored = 0;
  const report = timeRuns(() => {
    scored = computeScoreReport(diary, options).scored;
  });
  const detail = timeRuns(() => {
    computeScorecardDetail(diary, options);
  });
  console.log(
    `${diary.length} questions, ${total} forecasts (${label}), ${scored} scored: ` +
      `computeScoreReport median ${fmt(report.median)} [${report.runs.map(fmt).join(', ')}], ` +
      `CPU median ${fmt(report.cpuMedian)}; computeScorecardDetail median ${fmt(detail.median)}`,
  );
}
