/**
 * A random diary file (JSON v1) from a seeded generator, with the shapes exports must keep
 * exactly: text with commas, double quotes, CR, LF (in notes and rules, the multi-line
 * fields; one-line fields such as titles refuse line breaks) and characters outside the BMP; lenses,
 * reference forecasts, every outcome, costs and base rates; numbers that need all 17
 * digits; and many questions sharing one close time, so a batch boundary of the export
 * falls inside a tie (the export orders by close time, then id).
 */
import { mulberry32 } from '../bench/make-diary';

const LINE_PIECES = ['Northgate', 'phase 2', 'a, b', 'the "big" one', 'Zürich ≥ ½', '日本', '🙂 ok', ' padded ', '=SUM(A1)', ''];
const PIECES = ['Northgate', 'phase 2', 'a, b', 'the "big" one', 'line\nbreak', 'cr\rhere', 'crlf\r\nthere', 'Zürich ≥ ½', '日本', '🙂 ok', ' padded ', '=SUM(A1)', ''];
const ZONES = ['Europe/London', 'America/New_York', 'Asia/Tokyo', 'UTC', 'Australia/Lord_Howe'];
const TAGS = ['client:northgate', 'renewals', 'pricing', 'hiring', 'regulation/eu'];
const NUMBERS = [0, 1, 0.5, 0.1 + 0.2, 1 / 3, 1e-7, 5e-324, 1 - 2 ** -53, 0.49999999999999994, 0.123456789012345];

export function randomDiaryFile(questions: number, seed: number): { format: string; version: number; settings: object; questions: object[] } {
  const rand = mulberry32(seed);
  const pick = <T>(xs: readonly T[]): T => xs[Math.floor(rand() * xs.length)]!;
  const text = (n: number) => Array.from({ length: n }, () => pick(PIECES)).join(' ').trim() || 'x';
  const line = (n: number) => Array.from({ length: n }, () => pick(LINE_PIECES)).join(' ').trim() || 'x';
  const p = () => (rand() < 0.3 ? pick(NUMBERS) : rand());
  const iso = (ms: number) => new Date(ms).toISOString();
  const tiedClose = Date.UTC(2027, 5, 30, 16);
  const out: object[] = [];
  for (let i = 0; i < questions; i++) {
    const opened = Date.UTC(2025, 0, 1) + Math.floor(rand() * 400) * 86_400_000 + Math.floor(rand() * 86_400_000);
    const closes = i % 3 === 0 ? tiedClose : opened + (1 + Math.floor(rand() * 300)) * 86_400_000;
    const forecasts = Array.from({ length: Math.floor(rand() * 5) }, () => {
      const f: Record<string, unknown> = { at: iso(opened + Math.floor(rand() * (closes - opened))), p: p(), note: rand() < 0.5 ? text(3) : '' };
      if (rand() < 0.2) f.lenses = [{ name: line(1), p: p(), weight: 1 + Math.floor(rand() * 3) }, { name: 'outside view', p: p(), weight: 0.5 }];
      return f;
    });
    const q: Record<string, unknown> = {
      id: rand() < 0.5 ? `q-${i}` : `${line(1).replace(/\s/g, '_')}-${i}`,
      title: line(2),
      rule: rand() < 0.7 ? text(4) : '',
      kind: rand() < 0.5 ? 'event_by_deadline' : 'state_at_deadline',
      tags: TAGS.filter(() => rand() < 0.3),
      opened_at: iso(opened),
      closes_at: iso(closes),
      time_zone: pick(ZONES),
      forecasts,
      references: rand() < 0.3 ? [{ at: iso(opened + 3_600_000), p: p(), source: line(1) }] : [],
      resolution: rand() < 0.6 ? { outcome: pick(['yes', 'no', 'void']), at: iso(closes), note: text(2) } : null,
    };
    if (rand() < 0.5) q.base_rate = p();
    if (rand() < 0.3) q.base_rate_note = text(2);
    if (rand() < 0.3) q.costs = { false_alarm: 1 + rand(), miss: 0.1 + 0.2 + i };
    if (rand() < 0.4) q.checkin_days = Math.floor(rand() * 30);
    out.push(q);
  }
  return {
    format: 'forelog-diary',
    version: 1,
    settings: { default_false_alarm_cost: 1, default_miss_cost: 3, default_checkin_days: 10, closing_soon_hours: 48, overdue_after_days: 5, time_zone: 'Europe/Paris' },
    questions: out,
  };
}
