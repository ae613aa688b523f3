// The plotly chart component, built from the small dist-min bundle. Import it only through
// React.lazy (see ./lazy-plot.tsx) so the ~1.4 MB chunk never lands in the first page's bundle.
import createPlotlyComponent from 'react-plotly.js/factory';
import Plotly from 'plotly.js-dist-min';

const Plot = createPlotlyComponent(Plotly);
export default Plot;
export { Plotly };
