import { HEAD, SURFACE_NOTE } from './common';

/** A levee under steady seepage (land side) and a rapid drawdown of the river (river side). */
export const levee = `${HEAD}#
# Starter: a clay levee 6 m high, the river on the left at its design level: the
# piezometric line stands above the river-side ground (ponded water) and falls through the
# bank to the land-side toe. Two design cases: steady seepage (land-side slope) and a rapid
# drawdown of the river after the flood (river-side slope).
format: scarpline/1
id: levee-starter
title: Levee, steady seepage and rapid drawdown (starter)
station: 0
offset: 30
units: si
ground: [[0, 24], [10, 24], [28, 30], [32, 30], [47, 24], [70, 24]]
materials:
  bank:
    description: Compacted sandy CLAY (levee fill)
    unitWeight: 19
    saturatedUnitWeight: 20
    strength: { model: mohr-coulomb, cohesion: 5, frictionAngle: 28 }
  foundation:
    description: Firm silty CLAY (floodplain)
    unitWeight: 18
    saturatedUnitWeight: 19
    strength: { model: mohr-coulomb, cohesion: 3, frictionAngle: 25 }
strata:
  - { material: bank }
  - { material: foundation, top: 24 }
water:
  # above the ground on the left: ponded water, its weight counts
  piezometric: [[0, 29], [25, 29], [36, 27], [47, 24], [70, 23.5]]
analysis:
  methods: [bishop, spencer, morgenstern-price]
  slices: 40
  # Morgenstern–Price f(ξ), ξ from 0 at the toe end to 1 at the crest end: constant, half-sine,
  # or piecewise-linear with points, e.g. { shape: piecewise-linear, points: [[0, 0.4], [0.5, 1], [1, 0.4]] }
  interslice: { shape: half-sine }
${SURFACE_NOTE}
  surface: { type: circle, center: [45, 38], radius: 16.1 }
  requiredFs: 1.5     # the requirement of a case that gives none
# Design cases: every case is analyzed, and the section meets its requirement only when every
# case does. A case starts from the settings above and changes what it gives: water, loads,
# seismic and crack replace the section's; materials merge by name; analysis merges setting by
# setting.
cases:
  - name: steady seepage
    kind: steady-seepage        # the settings above as they are: the land side
  - name: rapid drawdown
    kind: rapid-drawdown
    requiredFs: 1.2             # set by the design case and the governing code
    # the water before drawdown is the water above; after it, the river is back at +24.5
    drawdown:
      after: { piezometric: [[0, 24.5], [20, 24.5], [36, 26], [47, 24], [70, 23.5]] }
      # free: drains as the water falls; slow: keeps for a while the undrained strength of its
      # consolidation under the flood (dR, ψR: its isotropically consolidated undrained envelope)
      materials:
        bank: { drains: slow, dR: 10, psiR: 16 }
        foundation: { drains: slow, dR: 6, psiR: 14 }
    analysis:
      surface: { type: circle, center: [16, 39], radius: 17.5 }   # the river side
`;
