import { HEAD, SURFACE_NOTE } from './common';

/** A fill of clean sand: a face circle and the infinite-slope check side by side. */
export const sandFill = `${HEAD}#
# Starter: a 5 m fill of clean sand (c′ = 0) at 1 : 2 on stiff clay. With no cohesion the
# critical surface is shallow and parallel to the face, so the infinite-slope check runs
# beside a circle.
format: scarpline/1
id: sand-fill-starter
title: Clean sand fill, long-term drained (starter)
station: 0
units: si
ground: [[0, 45], [10, 45], [20, 40], [50, 40]]
materials:
  sand:
    description: Clean medium SAND, compacted
    unitWeight: 18.5
    strength: { model: mohr-coulomb, cohesion: 0, frictionAngle: 34 }
  stiff-clay:
    description: Stiff CLAY
    unitWeight: 20
    strength: { model: mohr-coulomb, cohesion: 8, frictionAngle: 28 }
strata:
  - { material: sand }
  - { material: stiff-clay, top: 40 }
analysis:
  methods: [bishop, infinite-slope]
  slices: 30
${SURFACE_NOTE}
  surface: { type: circle, center: [19, 55], radius: 14.8 }
  # the infinite slope: slope angle β (degrees), depth of the slip plane, m = hw / z
  infiniteSlope: { angle: 26.57, depth: 1.0, waterRatio: 0 }
  case: long-term
  requiredFs: 1.3
`;
