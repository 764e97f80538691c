/**
 * The forecast path of one confident call at a glance: the counted revisions as a step line
 * up to the window end, revisions made after it as hollow dots beyond the end line, the
 * "Confident at" band edges, and the outcome (0 or 100 %) as a mark at the window end.
 * Drawn as inline SVG with classes only (no style attributes; the app's policy allows none),
 * so it needs no chart library and prints with the page.
 */
import type { HindsightEntry } from '../../../../shared/contract';
import { extent } from '../../../../shared/extent';
import { wholePercent } from './wording';

const W = 260;
const H = 72;
const PAD = { left: 4, right: 12, top: 6, bottom: 6 };
const DAY_MS = 86_400_000;

const r = (v: number) => v.toFixed(1);

export function PathSparkline({ entry, threshold }: { entry: HindsightEntry; threshold: number }) {
  const times = entry.forecasts.map((f) => Date.parse(f.at));
  const end = Date.parse(entry.window_end);
  const span = extent(times);
  const t0 = Math.min(span.min, end);
  // A path made on the day the window closed still gets width to show its steps.
  const t1 = Math.max(span.max, end, t0 + DAY_MS);
  const x = (t: number) => PAD.left + ((t - t0) / (t1 - t0)) * (W - PAD.left - PAD.right);
  const y = (p: number) => PAD.top + (1 - p) * (H - PAD.top - PAD.bottom);

  const points = entry.forecasts.map((f, i) => ({ t: times[i]!, p: f.p, counted: f.counted }));
  const counted = points.filter((f) => f.counted);
  const late = points.filter((f) => !f.counted);
  // A step line: each revision stands until the next one, the last until the window end.
  const d = counted
    .map((f, i) => `${i === 0 ? `M${r(x(f.t))},${r(y(f.p))}` : `V${r(y(f.p))}`} H${r(x(counted[i + 1]?.t ?? end))}`)
    .join(' ');
  const low = Number((1 - threshold).toFixed(12));
  const outcomeY = y(entry.outcome === 'yes' ? 1 : 0);
  const label = `Forecast path: ${counted.map((f) => wholePercent(f.p)).join(', then ')}${
    late.length ? `; ${late.length} later revision${late.length === 1 ? '' : 's'} not scored` : ''
  }; it resolved ${entry.outcome === 'yes' ? 'Yes' : 'No'} at the window end.`;

  return (
    <figure className="hs-path">
      <svg className="hs-spark" viewBox={`0 0 ${W} ${H}`} width={W} height={H} role="img" aria-label={label} data-testid="forecast-path">
        <line className="hs-spark__band" x1={PAD.left} x2={W - PAD.right} y1={y(threshold)} y2={y(threshold)} />
        <line className="hs-spark__band" x1={PAD.left} x2={W - PAD.right} y1={y(low)} y2={y(low)} />
        <line className="hs-spark__end" x1={x(end)} x2={x(end)} y1={PAD.top} y2={H - PAD.bottom} />
        {d ? <path className="hs-spark__line" d={d} /> : null}
        {counted.map((f, i) => (
          <circle key={`counted-${i}`} className="hs-spark__dot" cx={x(f.t)} cy={y(f.p)} r={2.5} />
        ))}
        {late.map((f, i) => (
          <circle key={`late-${i}`} className="hs-spark__late" cx={x(f.t)} cy={y(f.p)} r={3} />
        ))}
        <rect
          className={`hs-spark__outcome hs-spark__outcome--${entry.verdict}`}
          x={x(end) - 4}
          y={outcomeY - 4}
          width={8}
          height={8}
          transform={`rotate(45 ${x(end)} ${outcomeY})`}
        />
      </svg>
      <figcaption className="hs-path__legend" aria-hidden="true">
        Your forecast until the window end (dotted) · <span className={`hs-path__key hs-path__key--${entry.verdict}`}>◆</span> outcome
        {late.length ? (
          <>
            {' '}
            · <span className="hs-path__key hs-path__key--late">○</span> late
          </>
        ) : null}
      </figcaption>
    </figure>
  );
}
