// The 2-D chart component, built from the cartesian plotting bundle (scatter, bar, contour,
// heatmap, histogram, box…). Import it only through React.lazy (see ./lazy-plot.tsx) so the chunk
// never lands in a page's first bundle; 3-D charts use ./plotly-3d.tsx instead.
import createPlotlyComponent from 'react-plotly.js/factory';
import Plotly from 'plotly.js-cartesian-dist-min';

const Plot = createPlotlyComponent(Plotly);
export default Plot;
export { Plotly };
