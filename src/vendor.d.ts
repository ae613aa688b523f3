// The plotting bundles ship without types; they share the library's own declarations.
declare module 'plotly.js-cartesian-dist-min' {
  import Plotly from 'plotly.js';
  export default Plotly;
}
declare module 'plotly.js-gl3d-dist-min' {
  import Plotly from 'plotly.js';
  export default Plotly;
}
