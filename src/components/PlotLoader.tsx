// Plotly, loaded only when a plot is first shown (its chunk is about 1.5 MB
// gzipped): react-plotly.js's factory with the plotly.js-dist-min alias, as
// STACK-NOTES.md prescribes. Used by client-only islands.
import { useEffect, useRef, useState, type ComponentType } from 'react';
import type { PlotParams } from 'react-plotly.js/factory';

let loading: Promise<ComponentType<PlotParams>> | null = null;

export function loadPlot(): Promise<ComponentType<PlotParams>> {
  loading ??= Promise.all([import('react-plotly.js/factory'), import('plotly.js')]).then(([factory, plotly]) => {
    const create = (factory as any).default ?? factory;
    const Plotly = (plotly as any).default ?? plotly;
    return create(Plotly) as ComponentType<PlotParams>;
  });
  return loading;
}

/** The Plot component once `enabled` has been true, with the load error in words. */
export function usePlot(enabled: boolean): { Plot: ComponentType<PlotParams> | null; error: string | null } {
  const [Plot, setPlot] = useState<ComponentType<PlotParams> | null>(null);
  const [error, setError] = useState<string | null>(null);
  useEffect(() => {
    if (!enabled || Plot) return;
    let live = true;
    loadPlot().then(
      (P) => live && setPlot(() => P),
      (e) => live && setError(`The plotting code could not be loaded (${(e as Error).message}). Reload the page to try again.`),
    );
    return () => {
      live = false;
    };
  }, [enabled, Plot]);
  return { Plot, error };
}

/** True once the element has scrolled into view (or at once where IntersectionObserver is missing). */
export function useSeen<T extends Element>(): [React.RefObject<T | null>, boolean] {
  const ref = useRef<T | null>(null);
  const [seen, setSeen] = useState(false);
  useEffect(() => {
    if (seen || !ref.current) return;
    if (typeof IntersectionObserver === 'undefined') {
      setSeen(true);
      return;
    }
    const io = new IntersectionObserver((entries) => {
      if (entries.some((e) => e.isIntersecting)) {
        setSeen(true);
        io.disconnect();
      }
    }, { rootMargin: '200px' });
    io.observe(ref.current);
    return () => io.disconnect();
  }, [seen]);
  return [ref, seen];
}

/** Our palette for plots (src/styles/global.css). */
export const PLOT_COLOURS = {
  ink: '#12343b',
  query: '#1f7a7a',
  reference: '#b85c25',
  muted: '#5f6b6d',
  line: '#d9d4c7',
  moss: '#5b7f2b',
  amber: '#b7861a',
  paper: '#f7f5f0',
};

export const PLOT_FONT = { family: '"Source Sans 3", system-ui, sans-serif', size: 13, color: '#12343b' };

export function PlotSkeleton({ height = 320, label = 'Loading the plot…' }: { height?: number; label?: string }) {
  return (
    <div className="skeleton flex items-center justify-center text-sm text-muted" style={{ height }} role="status" aria-live="polite">
      {label}
    </div>
  );
}
