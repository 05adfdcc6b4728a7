// Frequency-dependent lines in the time domain: a line described by its exact Z'(jω), Y'(jω)
// (skin effect, Djordjevic–Sarkar dielectric) is replaced, before discretizing, by a realisation
// with a few R‖L sections in series and R–C branches in shunt, fitted over the band the run needs.
import type { LineRLGC, Net } from './model.js';
import { mapRouteLines } from './route-tree.js';
import { timeDomainRealisation, type TimeDomainRealisation } from './lines/freq-model.js';
import { activityEnd, fastestEdge } from './signals.js';

export interface Band {
  fmin: number;
  fmax: number;
}

/**
 * The band a run needs: up to ten times the edge's knee frequency 0.35/t_r (the usual bandwidth of a
 * 10–90 % edge, Johnson & Graham, High-Speed Digital Design, ch. 1) and down to half the inverse
 * run length (slower changes do not fit in the run).
 */
export function runBand(net: Net, duration: number): Band {
  const edge = fastestEdge(net.driver.signal);
  const fmax = Number.isFinite(edge) ? 3.5 / edge : 10 / duration;
  const span = Math.max(duration, activityEnd(net.driver.signal));
  return { fmin: Math.min(0.5 / span, fmax / 1e3), fmax };
}

/**
 * Terms per fit: two per decade of band, 4 to 8. Four terms leave about 10 % ripple in the loss over
 * four decades and eight about 1 % (measured on an FR-4 microstrip, see test/sim/realize.test.ts).
 */
export function termsForBand(band: Band): number {
  return Math.min(8, Math.max(4, Math.round(2 * Math.log10(band.fmax / band.fmin))));
}

export function realizeLine(line: LineRLGC, band: Band, terms?: { skinTerms: number; debyeTerms: number }): { line: LineRLGC; fit: TimeDomainRealisation } {
  const n = termsForBand(band);
  terms ??= { skinTerms: n, debyeTerms: n };
  const fit = timeDomainRealisation(line.wideband!, band.fmin, band.fmax, terms);
  return {
    fit,
    line: {
      r: fit.series.r0,
      l: fit.series.l,
      g: fit.shunt.g0,
      c: fit.shunt.c,
      series: fit.series.sections.map((s) => ({ value: s.r, tau: s.tau })),
      shunt: fit.shunt.branches.map((b) => ({ value: b.c, tau: b.tau })),
      wideband: line.wideband,
    },
  };
}

/** The net with every wideband line realised for `band` (lines that already have their terms are kept). */
export function realizeNet(net: Net, band: Band): { net: Net; fits: Map<string, TimeDomainRealisation> } {
  const fits = new Map<string, TimeDomainRealisation>();
  const route = mapRouteLines(net.route, (line, item) => {
    if (!line.wideband || line.series || line.shunt) return line;
    const r = realizeLine(line, band);
    fits.set(item.name, r.fit);
    return r.line;
  });
  return { net: { ...net, route }, fits };
}
