import { HEAD, SURFACE_NOTE } from './common';

/** An embankment on soft clay at the end of construction (undrained). */
export const embankment = `${HEAD}#
# Starter: a 5 m embankment of granular fill on soft clay, end of construction: the clay
# undrained, its Su growing with depth below the original ground.
format: scarpline/1
id: embankment-starter
title: Embankment on soft clay, end of construction (starter)
station: 0
offset: 0
units: si
ground: [[0, 15], [12, 15], [22, 10], [60, 10]]
materials:
  fill:
    description: Compacted granular fill
    unitWeight: 20
    strength: { model: mohr-coulomb, cohesion: 0, frictionAngle: 34 }
  soft-clay:
    description: Soft CLAY; Su from vane tests
    unitWeight: 16.5
    # Su = su at suDatum, growing by suRate (kPa per m) below it
    strength: { model: undrained, su: 15, suRate: 1.5, suDatum: 10 }
  gravel:
    description: Dense gravel, taken as a rigid base
    strength: { model: rigid }
strata:
  - { material: fill }
  - { material: soft-clay, top: 10 }
  - { material: gravel, top: 0 }
water: { piezometric: 10 }
loads:
  - { type: strip, from: 0, to: 8, pressure: 10 }   # traffic on the crest
analysis:
  methods: [bishop, spencer]
  slices: 40
${SURFACE_NOTE}
  surface: { type: circle, center: [20, 21], radius: 16 }
  case: end-of-construction
  requiredFs: 1.3
`;
