// The theme colours of src/styles/global.css for code that draws on a canvas or
// in SVG (chart.js, the route drawing), where CSS variables do not reach.
// Keep the two in step.
export const PALETTE = {
  ink: '#1d2a2f',
  inkSoft: '#4b5b61',
  line: '#d6d1c4',
  lineStrong: '#8f8a7d',
  lagoon: '#1e5a5f',
  lagoonTint: '#e3efee',
  ochre: '#7a4f05',
  ochreTint: '#fbf0d9',
  brick: '#9c2f29',
  slate: '#3a5378',
  slateTint: '#e7edf6',
  moss: '#2f6133',
  mossTint: '#e6f1e5',
  surface: '#ffffff',
} as const;
