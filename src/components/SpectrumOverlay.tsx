// Query against one hit: head-to-tail (query up, reference down) above the
// difference view (query minus reference in the same unit bins), both on one
// shared m/z axis so zooming one zooms the other. Hover gives m/z and both
// intensities. Loaded lazily by the Identify view when a hit is first opened.
import { useMemo } from 'react';
import { PLOT_COLOURS, PLOT_FONT, PlotSkeleton, usePlot } from './PlotLoader';
import { pairBins, topPeaks, type PeakPair } from './identify/spectrumBins';

export interface SpectrumOverlayProps {
  query: PeakPair[];
  reference: PeakPair[];
  referenceName: string;
}

export default function SpectrumOverlay({ query, reference, referenceName }: SpectrumOverlayProps) {
  const { Plot, error } = usePlot(true);
  const bins = useMemo(() => pairBins(query, reference), [query, reference]);
  const custom = bins.mz.map((_, i) => [bins.query[i], bins.reference[i], bins.difference[i]]);
  const hover = 'm/z %{x}<br>query %{customdata[0]:.1f}<br>reference %{customdata[1]:.1f}<br>difference %{customdata[2]:+.1f}<extra></extra>';
  const labels = useMemo(() => {
    const q = topPeaks(bins.mz, bins.query, 6);
    const r = topPeaks(bins.mz, bins.reference, 6);
    return { q, r };
  }, [bins]);
  const biggest = useMemo(
    () =>
      bins.mz
        .map((m, i) => ({ mz: m, q: bins.query[i], r: bins.reference[i], d: bins.difference[i] }))
        .filter((x) => Math.abs(x.d) >= 5)
        .sort((a, b) => Math.abs(b.d) - Math.abs(a.d))
        .slice(0, 5),
    [bins],
  );
  const lo = Math.max(0, (bins.mz[0] ?? 0) - 5);
  const hi = (bins.mz[bins.mz.length - 1] ?? 100) + 5;

  return (
    <div data-testid="overlay">
      {error && <p role="alert" className="rounded-md bg-alert-soft px-3 py-2 text-sm text-alert">{error}</p>}
      {!Plot && !error && <PlotSkeleton height={520} label="Loading the overlay…" />}
      {Plot && (
        <Plot
          data={[
            {
              type: 'bar',
              name: 'query (unknown), up',
              x: bins.mz,
              y: bins.query,
              customdata: custom,
              width: 0.55,
              marker: { color: PLOT_COLOURS.query },
              hovertemplate: hover,
              xaxis: 'x',
              yaxis: 'y',
            },
            {
              type: 'bar',
              name: `reference: ${referenceName}, down`,
              x: bins.mz,
              y: bins.reference.map((v) => -v),
              customdata: custom,
              width: 0.55,
              marker: { color: PLOT_COLOURS.reference },
              hovertemplate: hover,
              xaxis: 'x',
              yaxis: 'y',
            },
            {
              type: 'bar',
              name: 'difference (query − reference)',
              x: bins.mz,
              y: bins.difference,
              customdata: custom,
              width: 0.55,
              marker: { color: bins.difference.map((d) => (d >= 0 ? PLOT_COLOURS.query : PLOT_COLOURS.reference)), opacity: 0.75 },
              hovertemplate: hover,
              xaxis: 'x',
              yaxis: 'y2',
              showlegend: false,
            },
          ]}
          layout={{
            height: 520,
            margin: { l: 55, r: 15, t: 30, b: 45 },
            font: PLOT_FONT,
            paper_bgcolor: '#ffffff',
            plot_bgcolor: '#ffffff',
            barmode: 'overlay',
            bargap: 0,
            hovermode: 'closest',
            legend: { orientation: 'h', x: 0, y: 1.08 },
            xaxis: { title: { text: 'm/z' }, range: [lo, hi], anchor: 'y2', gridcolor: PLOT_COLOURS.line, zeroline: false },
            yaxis: {
              domain: [0.36, 1],
              range: [-112, 112],
              tickvals: [-100, -50, 0, 50, 100],
              ticktext: ['100', '50', '0', '50', '100'],
              title: { text: 'relative intensity' },
              gridcolor: PLOT_COLOURS.line,
              zeroline: true,
              zerolinecolor: PLOT_COLOURS.ink,
            },
            yaxis2: {
              domain: [0, 0.27],
              range: [-105, 105],
              tickvals: [-100, 0, 100],
              title: { text: 'difference' },
              gridcolor: PLOT_COLOURS.line,
              zeroline: true,
              zerolinecolor: PLOT_COLOURS.ink,
            },
            annotations: [
              ...labels.q.map((m) => ({ x: m, y: bins.query[bins.mz.indexOf(m)], yref: 'y', text: String(m), showarrow: false, yshift: 9, font: { ...PLOT_FONT, size: 11, color: PLOT_COLOURS.query } })),
              ...labels.r.map((m) => ({ x: m, y: -bins.reference[bins.mz.indexOf(m)], yref: 'y', text: String(m), showarrow: false, yshift: -9, font: { ...PLOT_FONT, size: 11, color: PLOT_COLOURS.reference } })),
            ],
          }}
          config={{ displaylogo: false, responsive: true, modeBarButtonsToRemove: ['lasso2d', 'select2d'] }}
          useResizeHandler
          style={{ width: '100%' }}
        />
      )}
      <p className="mt-1 text-xs text-muted">Both spectra scaled to their own base peak = 100, summed into unit-mass bins. Drag to zoom (both views follow), double-click to reset.</p>
      {biggest.length > 0 && (
        <div className="mt-3">
          <h4 className="text-sm font-semibold text-ink-soft">Largest differences</h4>
          <ul className="mt-1 flex flex-wrap gap-2 text-sm" data-testid="largest-differences">
            {biggest.map((b) => (
              <li key={b.mz} className="rounded border border-line px-2 py-0.5">
                m/z {b.mz}: query {b.q.toFixed(0)}, reference {b.r.toFixed(0)}
              </li>
            ))}
          </ul>
        </div>
      )}
    </div>
  );
}
