import { HEAD, SURFACE_NOTE } from './common';

/** A cut slope in clay, long-term drained, with a piezometric line. */
export const cut = `${HEAD}#
# Starter: a 10 m cut at 1 vertical : 2 horizontal in stiff clay, long-term drained.
format: scarpline/1
id: cut-starter
title: Cut slope, long-term drained (starter)
station: 0          # chainage of the section (m)
offset: 0           # x of the alignment (centreline) in this section
units: si           # si: m, kN, kPa, kN/m³   us: ft, lbf, psf, pcf
# The ground surface, left to right, x strictly increasing.
ground: [[0, 50], [20, 50], [40, 60], [70, 61]]
materials:
  clay:
    description: Stiff sandy CLAY
    unitWeight: 20            # γ above the piezometric line
    saturatedUnitWeight: 20.5 # γsat below it (defaults to unitWeight)
    # mohr-coulomb: c′ (kPa) and φ′ (degrees); undrained: su (kPa), optional suRate and suDatum;
    # rigid: rigid base: no slip surface enters it.
    strength: { model: mohr-coulomb, cohesion: 5, frictionAngle: 28 }
  rock:
    description: Weathered rock, taken as a rigid base
    strength: { model: rigid }
# Strata from the top down: the first one's top is the ground; later tops are an elevation
# or a polyline.
strata:
  - { material: clay }
  - { material: rock, top: 42 }
# Pore water: a piezometric line (u = γw·(line − y) below it; ponded where it is above the
# ground), or ru: 0.2 (pore-pressure ratio).
water:
  piezometric: [[0, 49.5], [20, 49.5], [45, 55], [70, 57]]
# Loads: strip surcharges { type: strip, from, to, pressure } and line loads
# { type: line, x, force, angle } (angle from the downward vertical, degrees).
loads:
  - { type: strip, from: 45, to: 55, pressure: 10 }
# seismic: { kh: 0.1, kv: 0 }             # pseudo-static coefficients
# crack: { depth: auto, waterDepth: 0 }   # tension crack: a depth, or auto (Rankine)
analysis:
  # ordinary, bishop, janbu, spencer, morgenstern-price, phi-zero-circle, log-spiral, infinite-slope
  methods: [bishop, spencer]
  slices: 40
${SURFACE_NOTE}
  surface: { type: circle, center: [25, 72], radius: 24 }
  case: long-term
  requiredFs: 1.5     # set by the design case and the governing code
`;
