import { HEAD, SURFACE_NOTE } from './common';

/** A steep cut held by rows of soil nails behind a facing. */
export const nailedCut = `${HEAD}#
# Starter: a 9 m cut at 70° in stiff residual clay over weathered mudstone, held by five rows of
# grouted soil nails behind a shotcrete facing; long term, the water table behind the face.
format: scarpline/1
id: nailed-cut-starter
title: Soil-nailed cut, long term (starter)
station: 0          # chainage of the section (m)
offset: 0           # x of the alignment (centreline) in this section
units: si           # si: m, kN, kPa, kN/m³   us: ft, lbf, psf, pcf
ground: [[0, 100], [12, 100], [15.28, 109], [40, 109]]
materials:
  residual:
    description: Stiff brown silty CLAY (residual soil)
    unitWeight: 19
    saturatedUnitWeight: 20
    strength: { model: mohr-coulomb, cohesion: 6, frictionAngle: 28 }
  mudstone:
    description: Weathered MUDSTONE
    unitWeight: 21
    strength: { model: mohr-coulomb, cohesion: 15, frictionAngle: 32 }
strata:
  - { material: residual }
  - { material: mudstone, top: [[0, 97], [40, 101]] }
water:
  piezometric: [[0, 99.5], [12, 99.5], [22, 103], [40, 105]]
# Each nail row: its head on the face, inclination below the horizontal (degrees), length and
# horizontal spacing; per nail its bar's tensile capacity, its bond per m of nail and the facing's
# capacity at its head (each after its factors). Where the slip surface crosses a nail the least
# of its bar, its bond behind the surface and its facing with the bond in front acts, per m run.
# It runs into the slope (toward: left or right to say so). Anchors: type anchor, with freeLength,
# bondLength, capacity and acts: load (prestressed) or mobilised. Piles: type pile, x, bottom, shear.
reinforcement:
  - { type: nail, name: row 1, head: [12.18, 100.5], inclination: 15, length: 11, spacing: 1.5, tensileCapacity: 135, bond: 24, facingCapacity: 150 }
  - { type: nail, name: row 2, head: [12.8, 102.2], inclination: 15, length: 11, spacing: 1.5, tensileCapacity: 135, bond: 24, facingCapacity: 150 }
  - { type: nail, name: row 3, head: [13.42, 103.9], inclination: 15, length: 11, spacing: 1.5, tensileCapacity: 135, bond: 24, facingCapacity: 150 }
  - { type: nail, name: row 4, head: [14.04, 105.6], inclination: 15, length: 11, spacing: 1.5, tensileCapacity: 135, bond: 24, facingCapacity: 150 }
  - { type: nail, name: row 5, head: [14.66, 107.3], inclination: 15, length: 11, spacing: 1.5, tensileCapacity: 135, bond: 24, facingCapacity: 150 }
analysis:
  methods: [bishop, janbu]
  slices: 40
${SURFACE_NOTE}
  surface: { type: auto }
  case: long-term
  requiredFs: 1.35    # set by the design case and the governing code
`;
