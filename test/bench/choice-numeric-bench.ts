/**
 * Times the choice and numeric scoring engines on large synthetic diaries: 10,000
 * questions of each type with 20 revisions each on average, from a seeded PRNG so every
 * run scores the same data. Prints the median of 5 runs (the first includes JIT warm-up)
 * and the process's CPU time, steadier when other work shares the machine.
 * Run: `npx tsx test/bench/choice-numeric-bench.ts`.
 */
import {
  computeChoiceDetail,
  computeChoiceReport,
  computeNumericDetail,
  computeNumericReport,
  type ScoringChoiceQuestion,
  type ScoringNumericQuestion,
} from '../../shared/scoring/index';
import { mulberry32 } from '../unit/scoring-support';

const QUESTIONS = 10_000;
const REVISIONS = 20;
const RUNS = 5;
const DAY = 86_400_000;
const LEVEL_SETS = [[0.1, 0.5, 0.9], [0.05, 0.25, 0.5, 0.75, 0.95], [0.05, 0.1, 0.25, 0.5, 0.75, 0.9, 0.95], [0.5]];

interface Window {
  closes: number;
  resolvedAt: number | null;
  void: boolean;
  times: number[];
}

/** Open on some day of 2020–2024, close 10–180 days on; 15 % open, 5 % void; revisions spread to just past the close. */
function window(rand: () => number): Window {
  const opened = Date.UTC(2020, 0, 1) + Math.floor(rand() * 1500) * DAY;
  const closes = opened + (10 + Math.floor(rand() * 170)) * DAY;
  const roll = rand();
  const count = 1 + Math.floor(rand() * (2 * REVISIONS - 1));
  const times = Array.from({ length: count }, (_, j) => opened + Math.floor(((j + rand()) / count) * (closes - opened) * 1.05));
  return { closes, resolvedAt: roll < 0.15 ? null : closes, void: roll >= 0.15 && roll < 0.2, times };
}

function choiceDiary(seed: number): ScoringChoiceQuestion[] {
  const rand = mulberry32(seed);
  return Array.from({ length: QUESTIONS }, (_, i) => {
    const K = 2 + Math.floor(rand() * 11);
    const w = window(rand);
    const vector = () => {
      const raw = Array.from({ length: K }, () => 1 + Math.floor(rand() * 20));
      const total = raw.reduce((s, x) => s + x, 0);
      return raw.map((x) => x / total);
    };
    return {
      id: `c${i}`,
      title: `Synthetic choice ${i}`,
      tags: i % 7 === 0 ? ['work'] : [],
      closes_at: w.closes,
      resolution:
        w.resolvedAt === null ? null : w.void ? { outcome: 'void', at: w.resolvedAt } : { outcome: 'option', option: Math.floor(rand() * K), at: w.resolvedAt },
      option_count: K,
      ordered: i % 2 === 0,
      option_base_rates: i % 3 === 0 ? vector() : null,
      forecasts: w.times.map((at, seq) => ({ at, probs: vector(), seq })),
    };
  });
}

function numericDiary(seed: number): ScoringNumericQuestion[] {
  const rand = mulberry32(seed);
  return Array.from({ length: QUESTIONS }, (_, i) => {
    const levels = LEVEL_SETS[i % LEVEL_SETS.length]!;
    const w = window(rand);
    const centre = Math.floor(rand() * 200);
    const quantiles = () => {
      const spread = 1 + rand() * 30;
      return levels.map((tau) => centre + (tau - 0.5) * 2 * spread);
    };
    return {
      id: `n${i}`,
      title: `Synthetic numeric ${i}`,
      tags: i % 7 === 0 ? ['work'] : [],
      closes_at: w.closes,
      resolution:
        w.resolvedAt === null ? null : w.void ? { outcome: 'void', at: w.resolvedAt } : { outcome: 'value', value: centre + (rand() - 0.5) * 80, at: w.resolvedAt },
      unit: 'weeks',
      value_kind: 'number',
      levels,
      forecasts: w.times.map((at, seq) => ({ at, quantiles: quantiles(), seq })),
    };
  });
}

const median = (xs: number[]) => xs.slice().sort((a, b) => a - b)[Math.floor(xs.length / 2)]!;

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

const choices = choiceDiary(42);
const numerics = numericDiary(43);
let scoredChoice = 0;
let scoredNumeric = 0;
const choiceReport = timeRuns(() => {
  scoredChoice = computeChoiceReport(choices, {}).scored;
});
const choiceDetail = timeRuns(() => computeChoiceDetail(choices, {}));
const numericReport = timeRuns(() => {
  scoredNumeric = computeNumericReport(numerics, {}).scored;
});
const numericDetail = timeRuns(() => computeNumericDetail(numerics, {}));
const count = (qs: { forecasts: unknown[] }[]) => qs.reduce((s, q) => s + q.forecasts.length, 0);
console.log(
  `${choices.length} choice questions, ${count(choices)} forecasts, ${scoredChoice} scored: computeChoiceReport median ` +
    `${fmt(choiceReport.median)} [${choiceReport.runs.map(fmt).join(', ')}], CPU median ${fmt(choiceReport.cpuMedian)}; ` +
    `computeChoiceDetail median ${fmt(choiceDetail.median)}`,
);
console.log(
  `${numerics.length} numeric questions, ${count(numerics)} forecasts, ${scoredNumeric} scored: computeNumericReport median ` +
    `${fmt(numericReport.median)} [${numericReport.runs.map(fmt).join(', ')}], CPU median ${fmt(numericReport.cpuMedian)}; ` +
    `computeNumericDetail median ${fmt(numericDetail.median)}`,
);
