import { HEAD, SURFACE_NOTE } from './common';

/** A cut in jointed rock under residual soil, the rock in the generalised Hoek–Brown criterion. */
export const rockCut = `${HEAD}#
# Starter: a 15 m blasted cut at about 1.2 vertical : 1 horizontal in weathered siltstone under
# 2 m of residual soil, long-term drained. The rock mass is not a straight Mohr–Coulomb line:
# each slice base takes the tangent c, φ of the Hoek–Brown envelope at its own normal stress.
format: scarpline/1
id: rock-cut-starter
title: Rock cut, long-term drained (starter)
station: 0          # chainage of the section (m)
offset: 0           # x of the alignment (centreline) in this section
units: si           # si: m, kN, kPa, kN/m³   us: ft, lbf, psf, pcf
# The ground surface, left to right, x strictly increasing.
ground: [[0, 50], [15, 50], [27.5, 65], [31, 67], [60, 68]]
materials:
  residual:
    description: Stiff brown sandy CLAY (residual soil)
    unitWeight: 19
    saturatedUnitWeight: 20
    strength: { model: mohr-coulomb, cohesion: 5, frictionAngle: 28 }
  siltstone:
    description: Weathered SILTSTONE with thin sandstone beds, closely jointed
    unitWeight: 24
    # hoek-brown: intactStrength σci (kPa, or with its unit: 10 MPa), gsi (0–100), mi (the
    # intact rock's constant) and disturbance D (0 undisturbed … 1 heavily blasted).
    # Other strengths that vary with stress: undrained-ratio (Su from σ′v), shear-normal
    # (points [σ′n, τ]) and bilinear (two friction angles either side of a break stress).
    strength: { model: hoek-brown, intactStrength: 10 MPa, gsi: 30, mi: 10, disturbance: 0.7 }
# Strata from the top down: the first one's top is the ground; later tops are an elevation
# or a polyline.
strata:
  - { material: residual }
  - { material: siltstone, top: [[0, 50], [15, 50], [27.5, 65], [31, 65.5], [60, 66]] }
# Pore water: a piezometric line (u = γw·(line − y) below it; ponded where it is above the
# ground), or ru: 0.2 (pore-pressure ratio).
water:
  piezometric: [[0, 49], [15, 49], [35, 57], [60, 60]]
# seismic: { kh: 0.1, kv: 0 }             # pseudo-static coefficients
# crack: { depth: auto, waterDepth: 0 }   # tension crack: a depth, or auto (Rankine)
analysis:
  # ordinary, bishop, janbu, spencer, morgenstern-price, phi-zero-circle, log-spiral, infinite-slope
  methods: [bishop, spencer]
  slices: 40
${SURFACE_NOTE}
  surface: { type: auto }
  case: long-term
  requiredFs: 1.5     # set by the design case and the governing code
`;
