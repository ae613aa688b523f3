// The 3-D chart component (surface, scatter3d, mesh3d), built from the WebGL 3-D plotting bundle.
// Loaded only through Plot3D (./plot-3d.tsx), so only a page that opens a 3-D view pays for it.
import createPlotlyComponent from 'react-plotly.js/factory';
import Plotly from 'plotly.js-gl3d-dist-min';

const Plot = createPlotlyComponent(Plotly);
export default Plot;
export { Plotly };
