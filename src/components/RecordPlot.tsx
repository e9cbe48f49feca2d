// The record page's plots (client-only island): the stick spectrum with its
// strongest peaks labelled and the losses from the molecular ion marked, and
// the formula's isotope cluster drawn against the observed one. Plotly loads
// when the plot first scrolls into view.
import { useMemo } from 'react';
import { PLOT_COLOURS, PLOT_FONT, PlotSkeleton, usePlot, useSeen } from './PlotLoader';
import { topPeaks, unitBins } from './identify/spectrumBins';

export interface RecordPlotProps {
  peaks: [number, number][];
  molecularIon: number | null;
  losses: { fromMz: number; toMz: number; loss: number; composition: string }[];
  isotopes: { nominal: number; expected: number; observed: number }[] | null;
  formula: string | null;
  /** how many of the strongest peaks get their m/z written on them @default 8 */
  labelCount?: number;
}

export default function RecordPlot({ peaks, molecularIon, losses, isotopes, formula, labelCount = 8 }: RecordPlotProps) {
  const [ref, seen] = useSeen<HTMLDivElement>();
  const { Plot, error } = usePlot(seen);

  const spectrum = useMemo(() => {
    const bins = unitBins(peaks);
    const mz = [...bins.keys()].sort((a, b) => a - b);
    const y = mz.map((m) => bins.get(m)!);
    const labelled = new Set(topPeaks(mz, y, labelCount));
    if (molecularIon !== null) labelled.add(molecularIon);
    return { mz, y, labelled };
  }, [peaks, labelCount, molecularIon]);

  const shownLosses = losses.slice(0, 6);
  const maxMz = Math.max(...spectrum.mz, molecularIon ?? 0);

  const annotations = [
    ...spectrum.mz
      .filter((m) => spectrum.labelled.has(m))
      .map((m) => ({
        x: m,
        y: spectrum.y[spectrum.mz.indexOf(m)],
        text: m === molecularIon ? `<b>${m}</b> M⁺·` : String(m),
        showarrow: false,
        yshift: 10,
        // the molecular-ion label sits right of its stick, clear of the neighbouring peaks' labels
        ...(m === molecularIon ? { xanchor: 'left', xshift: 2 } : {}),
        font: { ...PLOT_FONT, size: 12, color: m === molecularIon ? PLOT_COLOURS.reference : PLOT_COLOURS.ink },
      })),
    ...shownLosses.map((l, i) => ({
      x: (l.toMz + l.fromMz) / 2,
      y: 106 + i * 8,
      yshift: 7,
      text: `M−${l.loss} (${l.composition.split(' or ')[0]})`,
      showarrow: false,
      font: { ...PLOT_FONT, size: 11, color: PLOT_COLOURS.reference },
    })),
  ];
  const shapes = shownLosses.map((l, i) => ({
    type: 'line',
    x0: l.toMz,
    x1: l.fromMz,
    y0: 106 + i * 8,
    y1: 106 + i * 8,
    line: { color: PLOT_COLOURS.reference, width: 1, dash: 'dot' },
  }));

  return (
    <div ref={ref} className="space-y-5" data-testid="record-plot">
      <div>
        <h3 className="mb-1 text-sm font-semibold text-ink-soft">Spectrum (relative intensity, base peak = 100)</h3>
        {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert">{error}</p>}
        {!Plot && !error && <PlotSkeleton height={340} />}
        {Plot && (
          <Plot
            data={[
              {
                type: 'bar',
                x: spectrum.mz,
                y: spectrum.y,
                width: 0.5,
                name: 'spectrum',
                marker: { color: PLOT_COLOURS.query },
                hovertemplate: 'm/z %{x}<br>%{y:.1f}<extra></extra>',
              },
            ]}
            layout={{
              height: 340,
              margin: { l: 50, r: 15, t: 10, b: 45 },
              font: PLOT_FONT,
              paper_bgcolor: '#ffffff',
              plot_bgcolor: '#ffffff',
              bargap: 0,
              showlegend: false,
              xaxis: { title: { text: 'm/z' }, range: [Math.max(0, Math.min(...spectrum.mz) - 5), maxMz + 10], gridcolor: PLOT_COLOURS.line, zeroline: false },
              yaxis: { title: { text: 'relative intensity' }, range: [0, shownLosses.length ? 112 + shownLosses.length * 8 + 6 : 112], gridcolor: PLOT_COLOURS.line, tickvals: [0, 25, 50, 75, 100] },
              annotations,
              shapes,
            }}
            config={{ displaylogo: false, responsive: true, modeBarButtonsToRemove: ['lasso2d', 'select2d'] }}
            useResizeHandler
            style={{ width: '100%' }}
          />
        )}
        {shownLosses.length > 0 && (
          <p className="mt-1 text-xs text-muted">Dotted brackets: losses from the molecular ion (m/z {molecularIon}) read from the spectrum; each is a candidate for the analyst to judge.</p>
        )}
      </div>
      {isotopes && isotopes.length > 0 && (
        <div>
          <h3 className="mb-1 text-sm font-semibold text-ink-soft">Isotope cluster at M: {formula} expected vs observed (highest = 100)</h3>
          {!Plot && !error && <PlotSkeleton height={220} />}
          {Plot && (
            <Plot
              data={[
                {
                  type: 'bar',
                  name: `expected from ${formula}`,
                  x: isotopes.map((p) => p.nominal),
                  y: isotopes.map((p) => p.expected),
                  marker: { color: PLOT_COLOURS.reference },
                  hovertemplate: 'm/z %{x}<br>expected %{y:.1f}<extra></extra>',
                },
                {
                  type: 'bar',
                  name: 'observed',
                  x: isotopes.map((p) => p.nominal),
                  y: isotopes.map((p) => p.observed),
                  marker: { color: PLOT_COLOURS.query },
                  hovertemplate: 'm/z %{x}<br>observed %{y:.1f}<extra></extra>',
                },
              ]}
              layout={{
                height: 220,
                barmode: 'group',
                margin: { l: 50, r: 15, t: 10, b: 40 },
                font: PLOT_FONT,
                paper_bgcolor: '#ffffff',
                plot_bgcolor: '#ffffff',
                legend: { orientation: 'h', y: 1.15 },
                xaxis: { title: { text: 'm/z' }, dtick: 1, gridcolor: PLOT_COLOURS.line },
                yaxis: { range: [0, 110], gridcolor: PLOT_COLOURS.line },
              }}
              config={{ displaylogo: false, responsive: true }}
              useResizeHandler
              style={{ width: '100%' }}
            />
          )}
        </div>
      )}
    </div>
  );
}
