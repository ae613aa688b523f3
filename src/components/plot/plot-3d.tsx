// A 3-D chart (surface, scatter3d) in the Cellwright theme. It takes the same props as LazyPlot
// and loads the WebGL 3-D plotting bundle only when it is drawn, so pages without a 3-D view never
// download it. Without WebGL it says so in our words and draws nothing.
import { lazy, useState } from 'react';
import { ThemedPlot, type PlotProps } from './lazy-plot';

const Gl3d = lazy(() => import('./plotly-3d'));

function webglAvailable(): boolean {
  try {
    const canvas = document.createElement('canvas');
    return Boolean(canvas.getContext('webgl2') ?? canvas.getContext('webgl'));
  } catch {
    return false;
  }
}

export function Plot3D(props: PlotProps) {
  const [webgl] = useState(webglAvailable);
  if (!webgl) {
    const height = typeof props.style?.height === 'number' ? props.style.height : 420;
    return (
      <div role="note" className="flex items-center justify-center rounded-md border border-dashed border-line bg-paper/40 px-6 text-center text-sm text-ink-700" style={{ height: Math.min(height, 220) }}>
        This browser has 3-D graphics (WebGL) turned off, so the 3-D view cannot be drawn. The contour view shows the same predictions.
      </div>
    );
  }
  return <ThemedPlot component={Gl3d} bundle="3d" {...props} />;
}
