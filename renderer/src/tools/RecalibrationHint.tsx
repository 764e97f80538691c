/**
 * What the number being stated has meant before: how often the user's resolved calls in
 * the same calibration bin came true (with n and the Wilson interval), and the value the
 * fitted calibration line maps it to. When the line cannot be fitted yet, it says why.
 * Bins and the fit come from the scorecard over the whole diary (api.score); the mapping is
 * shared/scoring's `recalibrate`, the bin rule its `binIndex` (SCORING.md "Bins").
 */
import { MIN_CALIBRATION_N, SCORECARD_BIN_EDGES, binIndex, recalibrate, type ScoreReport } from '../../../shared/scoring';
import { api } from '../api/client';
import { describeError } from '../api/errors';
import { useLoad } from '../api/useLoad';
import { formatPercent } from '../percent';
import { formatEstimate, formatRange, plural } from './format';
import './tools.css';
import { formatCount } from '../dates';

/** The hint's sentences for a stated `p` against a scorecard report. */
export function recalibrationText(p: number, report: ScoreReport): { said: string; fit: string } {
  const bin = binIndex(p, SCORECARD_BIN_EDGES);
  const row = report.bins.find((b) => b.index === bin);
  const near = `~${bin * 10}%`;
  const history = row
    ? `your ${near} calls came true ${formatEstimate(row.observed)} of the time (n = ${formatCount(row.n)}, 95% interval ${formatRange(row.wilson_low, row.wilson_high)})`
    : `none of your scored calls were near ${bin * 10}% yet`;
  const { intercept, slope, reason } = report.calibration;
  if (intercept !== null && slope !== null) {
    return {
      said: `You say ${formatPercent(p)} — ${history}; recalibrated: ${formatEstimate(recalibrate(p, intercept, slope))}.`,
      fit: `Recalibrated is where your number lands on the calibration line fitted to your ${plural(report.scored, 'scored question')} (slope ${slope.toFixed(2)}, intercept ${intercept.toFixed(2)}; a slope under 1 means your calls have run too extreme). Small samples mislead.`,
    };
  }
  const more = report.scored < MIN_CALIBRATION_N ? ` — resolve ${MIN_CALIBRATION_N - report.scored} more to see it` : '';
  return {
    said: `You say ${formatPercent(p)} — ${history}.`,
    fit: `No recalibrated value yet: ${reason ?? 'the calibration line could not be fitted'}${more}.`,
  };
}

export function RecalibrationHint({ p }: { p: number | null }) {
  const loaded = useLoad(() => api.score({}), []);
  if (p === null) return null;
  if (loaded.error && !loaded.data) {
    return (
      <p className="tool-note tool__explain" data-testid="recalibration-hint">
        Your track record could not be read, so there is no recalibration hint: {describeError(loaded.error)}
      </p>
    );
  }
  if (!loaded.data) {
    return (
      <p className="tool-note tool__explain" aria-busy="true">
        Reading your resolved calls…
      </p>
    );
  }
  const text = recalibrationText(p, loaded.data.report);
  return (
    <div className="tool-note" data-testid="recalibration-hint">
      <p className="tool-note__title">What your number has meant</p>
      <p>{text.said}</p>
      <p className="tool__explain">{text.fit}</p>
    </div>
  );
}
