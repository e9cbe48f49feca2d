// plotly.js is aliased to plotly.js-dist-min, which ships no types.
declare module 'plotly.js';
