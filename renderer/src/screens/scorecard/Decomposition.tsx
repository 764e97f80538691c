/**
 * The Brier score taken apart (Murphy 1973, with the within-bin terms of Stephenson, Coelho &
 * Jolliffe 2008; SCORING.md "Calibration and the Murphy decomposition"): five terms and the
 * identity that puts them back together, shown with the user's own numbers so the sum can be
 * checked by eye.
 */
import { memo } from 'react';
import type { Decomposition as Terms } from '../../../../shared/scoring/types';
import { plural } from '../../dates';
import { identityRows, score3 } from './format';

interface TermRow {
  key: keyof Terms;
  symbol: string;
  name: string;
  reading: string;
}

const TERMS: TermRow[] = [
  { key: 'reliability', symbol: 'REL', name: 'Reliability', reading: 'How far each bin’s forecast was from how often it came true. 0 is perfectly calibrated; lower is better.' },
  { key: 'resolution', symbol: 'RES', name: 'Resolution', reading: 'How far the bins’ outcome rates spread from the overall rate. Higher is better: it is subtracted.' },
  { key: 'uncertainty', symbol: 'UNC', name: 'Uncertainty', reading: 'How hard these questions were: ō(1 − ō), where ō is the share that came true. It depends on the questions, not the forecasts.' },
  { key: 'within_bin_variance', symbol: 'WBV', name: 'Within-bin variance', reading: 'Spread of forecasts inside each 10-point bin (a correction for binning).' },
  { key: 'within_bin_covariance', symbol: 'WBC', name: 'Within-bin covariance', reading: 'Whether higher forecasts inside a bin went with Yes more often (a correction for binning).' },
];

export const Decomposition = memo(function Decomposition({ terms, brier, scored }: { terms: Terms; brier: number | null; scored: number }) {
  const { reliability: rel, resolution: res, uncertainty: unc, within_bin_variance: wbv, within_bin_covariance: wbc } = terms;
  const complete = rel !== null && res !== null && unc !== null && wbv !== null && wbc !== null;
  const sum = complete ? rel - res + unc + wbv - wbc : null;
  return (
    <div className="table-card sc-decomposition" data-testid="decomposition">
      <table>
        <caption className="table-card__caption">Brier score decomposition over {plural(scored, 'scored question')}</caption>
        <thead>
          <tr>
            <th scope="col">Term</th>
            <th scope="col" className="num">Value</th>
            <th scope="col">What it measures</th>
          </tr>
        </thead>
        <tbody>
          {TERMS.map((t) => (
            <tr key={t.key}>
              <th scope="row" className="nowrap">
                {t.name} <abbr title={t.name}>({t.symbol})</abbr>
              </th>
              <td className="num">{score3(terms[t.key])}</td>
              <td className="muted">{t.reading}</td>
            </tr>
          ))}
        </tbody>
        <tfoot>
          <tr>
            <th scope="row">Identity</th>
            <td colSpan={2} className="sc-identity" data-testid="decomposition-identity">
              <p className="sc-identity__formula">BS = REL − RES + UNC + WBV − WBC</p>
              {complete ? (
                <span className="sc-identity__sum" role="list" aria-label="The identity with your numbers">
                  {identityRows({ rel, res, unc, wbv, wbc }).map((row) => (
                    <span key={row.symbol} role="listitem" className="sc-identity__row">
                      <span className="sc-identity__op">{row.op}</span>
                      <span className="sc-identity__value">{score3(row.value)}</span>
                      <span className="sc-identity__symbol">{row.symbol}</span>
                    </span>
                  ))}
                  <span role="listitem" className="sc-identity__row sc-identity__row--total">
                    <span className="sc-identity__op">=</span>
                    <strong className="sc-identity__value">{score3(sum)}</strong>
                    <span className="sc-identity__symbol">BS (Brier score {score3(brier)})</span>
                  </span>
                </span>
              ) : (
                <p>Needs at least one scored question.</p>
              )}
            </td>
          </tr>
        </tfoot>
      </table>
    </div>
  );
});
