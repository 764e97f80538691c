/**
 * What each way of deciding would have cost over the scored questions (SCORING.md
 * "Consequences"): acting on your forecasts, acting on the base rate, always acting, never
 * acting, and perfect foresight (which costs nothing). Costs are in the user's own units.
 */
import { memo, useMemo, useRef } from 'react';
import type { ChartConfiguration } from 'chart.js';
import type { DecisionSummary } from '../../../../shared/scoring/types';
import { ChartFigure } from './ChartFigure';
import { BASE_OPTIONS, axisStyle, useChart, type Palette } from './chartKit';
import { cost } from './format';

export interface PolicyCost {
  policy: 'yours' | 'base_rate' | 'always' | 'never' | 'perfect';
  label: string;
  /** Null when the total is larger than a double holds: no bar, and the table says why. */
  cost: number | null;
}

export function policyCosts(d: DecisionSummary): PolicyCost[] {
  return [
    { policy: 'yours', label: 'Your calls', cost: d.cost },
    { policy: 'base_rate', label: 'Acting on the base rate', cost: d.cost_base_rate },
    { policy: 'always', label: 'Always act', cost: d.cost_always },
    { policy: 'never', label: 'Never act', cost: d.cost_never },
    { policy: 'perfect', label: 'Perfect foresight', cost: 0 },
  ];
}

export const PolicyCosts = memo(function PolicyCosts({ decisions }: { decisions: DecisionSummary }) {
  const canvasRef = useRef<HTMLCanvasElement>(null);
  const rows = useMemo(() => policyCosts(decisions), [decisions]);

  useChart<'bar', PolicyCost[]>(
    canvasRef,
    (colors: Palette): ChartConfiguration<'bar'> => ({
      type: 'bar',
      data: {
        labels: [],
        datasets: [{ label: 'Total cost', data: [], borderWidth: 0, barPercentage: 0.7, categoryPercentage: 0.9 }],
      },
      options: {
        ...BASE_OPTIONS,
        indexAxis: 'y',
        font: { family: colors.font },
        scales: {
          x: { type: 'linear', min: 0, ...axisStyle(colors, 'Total cost (your units; lower is better)') },
          y: { type: 'category', ...axisStyle(colors) },
        },
        plugins: {
          legend: { display: false },
          tooltip: { callbacks: { label: (item) => `Cost ${cost(item.parsed.x ?? 0)}` } },
        },
      },
    }),
    (chart, data, colors) => {
      chart.data.labels = data.map((r) => r.label);
      const dataset = chart.data.datasets[0]!;
      dataset.data = data.map((r) => r.cost);
      dataset.backgroundColor = data.map((r) => (r.policy === 'yours' ? colors.own : colors.baseRate));
    },
    rows,
  );

  return (
    <ChartFigure
      testId="policy-costs-chart"
      canvasRef={canvasRef}
      points={rows}
      size="sm"
      description={`Total cost of each way of deciding. ${rows.map((r) => `${r.label}: ${cost(r.cost)}`).join('; ')}.`}
      caption="What each way of deciding would have cost in total over these questions (lower is better)."
      table={
        <table>
          <caption className="visually-hidden">Total cost by way of deciding</caption>
          <thead>
            <tr>
              <th scope="col">Way of deciding</th>
              <th scope="col" className="num">Total cost</th>
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.policy}>
                <th scope="row">{r.label}</th>
                <td className="num">{cost(r.cost)}</td>
              </tr>
            ))}
          </tbody>
        </table>
      }
    />
  );
});
