import { HEAD, SURFACE_NOTE } from './common';

/** A levee's land side under steady seepage, with ponded water on the river side. */
export const levee = `${HEAD}#
# Starter: a clay levee 6 m high, the river on the left at its design level: the
# piezometric line stands above the river-side ground (ponded water) and falls through the
# bank to the land-side toe. Steady seepage, land-side slope.
format: scarpline/1
id: levee-starter
title: Levee, land side under steady seepage (starter)
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
  case: steady-seepage
  requiredFs: 1.5
`;
