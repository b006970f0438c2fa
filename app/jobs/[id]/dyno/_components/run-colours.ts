// Run colours for the plots; each run is also named in the legend, never told by colour alone.
const RUN_COLOURS = ["#1a56db", "#b4490c", "#0b6b2e", "#7e22ce", "#a3120f", "#0e7490"];
export const runColour = (i: number) => RUN_COLOURS[i % RUN_COLOURS.length];
