/**
 * Tidal current ellipses and their east/north components.
 *
 * Components: u = Hu cos(Φ − gu), v = Hv cos(Φ − gv), Φ = ω t + V0 + u_nodal.
 * Ellipse: w = u + i v = e^{iθ} [A cos(Φ − g) + i B sin(Φ − g)], A ≥ 0 the
 * semi-major axis, B the signed semi-minor axis (B > 0: anticlockwise), θ the
 * inclination of the major axis anticlockwise from east, g the Greenwich phase.
 * The conversion goes through the rotary components w = W₊ e^{iΦ} + W₋ e^{−iΦ}
 * (e.g. Pugh 1987, §3.6; Xu 2000, "Ellipse parameters conversion and velocity
 * profiles for tidal currents"): W₊ = (U + iV)/2 and W₋ = (Ū + i V̄)/2 with
 * U = Hu e^{−i gu}; then A = |W₊| + |W₋|, B = |W₊| − |W₋|,
 * θ = (arg W₊ + arg W₋)/2 and g = (arg W₋ − arg W₊)/2.
 * θ is reported in [0°, 180°) and g in [0°, 360°).
 */

const RAD = Math.PI / 180;
const DEG = 180 / Math.PI;

export interface EllipseParameters {
  major: number;
  minor: number;
  inclinationDeg: number;
  phaseDeg: number;
}

export interface ComponentParameters {
  uAmplitude: number;
  uPhaseDeg: number;
  vAmplitude: number;
  vPhaseDeg: number;
}

function wrap360(deg: number): number {
  const r = deg % 360;
  return r < 0 ? r + 360 : r;
}

/** Ellipse parameters from the amplitude and phase of u (east) and v (north). */
export function ellipseFromComponents(c: ComponentParameters): EllipseParameters {
  const ur = c.uAmplitude * Math.cos(c.uPhaseDeg * RAD);
  const ui = -c.uAmplitude * Math.sin(c.uPhaseDeg * RAD);
  const vr = c.vAmplitude * Math.cos(c.vPhaseDeg * RAD);
  const vi = -c.vAmplitude * Math.sin(c.vPhaseDeg * RAD);
  // W₊ = (U + iV)/2, W₋ = (conj U + i conj V)/2
  const pr = (ur - vi) / 2;
  const pi = (ui + vr) / 2;
  const mr = (ur + vi) / 2;
  const mi = (-ui + vr) / 2;
  const ap = Math.hypot(pr, pi);
  const am = Math.hypot(mr, mi);
  const ep = Math.atan2(pi, pr);
  const em = Math.atan2(mi, mr);
  let theta = ((ep + em) / 2) * DEG;
  let g = ((em - ep) / 2) * DEG;
  theta = wrap360(theta);
  if (theta >= 180) {
    theta -= 180;
    g += 180;
  }
  return { major: ap + am, minor: ap - am, inclinationDeg: theta, phaseDeg: wrap360(g) };
}

/** Amplitude and phase of u (east) and v (north) from ellipse parameters. */
export function componentsFromEllipse(e: EllipseParameters): ComponentParameters {
  const ap = (e.major + e.minor) / 2;
  const am = (e.major - e.minor) / 2;
  const ep = (e.inclinationDeg - e.phaseDeg) * RAD;
  const em = (e.inclinationDeg + e.phaseDeg) * RAD;
  const pr = ap * Math.cos(ep);
  const pi = ap * Math.sin(ep);
  const mr = am * Math.cos(em);
  const mi = am * Math.sin(em);
  // U = W₊ + conj W₋, V = −i (W₊ − conj W₋)
  const ur = pr + mr;
  const ui = pi - mi;
  const vr = pi + mi;
  const vi = -(pr - mr);
  return {
    uAmplitude: Math.hypot(ur, ui),
    uPhaseDeg: wrap360(-Math.atan2(ui, ur) * DEG),
    vAmplitude: Math.hypot(vr, vi),
    vPhaseDeg: wrap360(-Math.atan2(vi, vr) * DEG),
  };
}
