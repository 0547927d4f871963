// Package plots draws every sunsight figure and writes the self-contained
// HTML design-review report. It computes no physics and imports no other
// sunsight package: callers fill plain tables (SkyMap, Timeline, YearView,
// ErrorDist, Gaps, Sweep, BudgetBars, Sensitivity), each with a Plot method
// that returns a *Chart, and a Report for WriteReport.
//
// # Model
//
// The sky map shows the body-frame sphere in the Hammer (Hammer–Aitoff)
// equal-area projection, see Hammer, seen from outside like a globe (+Z up,
// azimuth increasing to the right). The coverage classes 0, 1, 2, 3, 4+ are
// filled as one embedded raster (each pixel mapped back through
// InverseHammer to its azimuth–elevation cell), so the figure stays tens of
// KB with no seams; the blind class is near-black with hatching, 1…4+ a
// sequential ramp, checked by TestCoverageColoursDistinct for CIE76 ΔE ≥ 15
// between every pair in normal vision, simulated deuteranopia and
// protanopia (Machado et al. 2009) and greyscale. Body axes, boresights,
// obstructions, the Earth disc (a small circle of the Earth's angular
// radius about a fixed nadir) or the nadir track, and the sun track from a
// start marker to an arrow head are drawn over it, with the key outside
// the map.
//
// Legends of the other figures sit in a column right of the data. A Target
// is drawn as a dash-dot line with its verdict in the legend. Empirical
// CDFs step by 1/n per sorted sample on a logarithmic error axis; the p95
// of samples is gonum stat.Quantile(0.95, stat.Empirical); the p95 of a
// histogram is interpolated linearly inside its bin (common practice, no
// source). Histograms are step outlines (error: 40 log-spaced bins; gaps:
// bins of whole time steps, since gap durations are whole steps). A
// timeline whose sensor count changes more than 150 times in the span shows
// a rolling mean and min…max envelope over 240 windows instead of raw
// steps. Time axes are in minutes up to 12 h, hours beyond.
//
// Figures are 10 × 6 in (7.5 in tall with three panels) with 14 pt axis
// labels, 12 pt ticks and legend and an 11 pt caption, in Liberation Sans
// (SVG names it with Arial, Helvetica, sans-serif fallbacks); PNG at 192
// dpi, twice screen resolution (common practice for projection, no
// source). Save writes PNG, SVG or PDF through a temporary file renamed into
// place, so a failure never leaves a partial file.
//
// The report is one HTML file made with html/template and embedded CSS: no
// scripts, no remote assets; a verdict banner first, provenance, captions
// as <figcaption> text (the figures are drawn without their own caption),
// tables that scroll on narrow screens, and print rules sized for the
// smaller of A4 and Letter so a page holds two figures, with the scenario
// as a small-print appendix. Only SVG produced by Chart.SVG is inlined (its
// XML declaration and generator comment stripped); all other text is
// escaped.
//
// # Assumptions
//
// Azimuth is measured in the body X–Y plane from +X toward +Y, elevation
// from that plane toward +Z; sky-map cell edges lie half-way between the
// given centres. NaN in a series marks "undefined" and leaves a gap (gonum
// plotter.NewLine rejects NaN, so series are split there). Inputs of the
// wrong length or order are rejected with an error naming the field.
//
// # Accuracy
//
// Figures show the numbers they are given; nothing is smoothed or
// resampled. Projected cell areas match the sphere areas Δλ (sin φ₂ − sin φ₁)
// to better than 1e-3 (TestHammerEqualArea). The report is an analysis aid:
// it says so on its first screen, and flight hardware needs qualified
// verification.
//
// # References
//
//   - J. P. Snyder, "Map Projections — A Working Manual", USGS Professional
//     Paper 1395, 1987: Hammer projection (from memory; checked here in
//     closed form at the centre, poles and boundary ellipse x²/8 + y²/2 = 1,
//     and numerically for equal area).
//   - M. Okabe and K. Ito, "Color Universal Design", 2008 (from memory):
//     the series colours.
//   - S. van der Walt and N. Smith, the viridis colour map, 2015 (from
//     memory): the 1…4+ ramp.
//   - G. M. Machado, M. M. Oliveira and L. A. F. Fernandes, "A
//     physiologically-based model for simulation of color vision
//     deficiency", IEEE TVCG 15(6), 2009; checked against the colorspacious
//     library (testdata/gen_cvd_colorspacious.py). CIELAB and ΔE*ab: CIE
//     15:2004.
//   - gonum/plot v0.17.0 for drawing; its cmpimg golden-file pattern for
//     testdata/golden/*.svg, one per figure kind (regenerate with
//     `go test ./plots -run Golden -regen`).
package plots
