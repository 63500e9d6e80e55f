// plotly.js-cartesian-dist-min ships no types; the plot component hands the module to angular-plotly.js as is.
declare module 'plotly.js-cartesian-dist-min' {
  const plotly: object;
  export default plotly;
}
