import { HEAD, SURFACE_NOTE } from './common';

/** An embankment on soft clay in two design cases: end of construction and long term. */
export const embankment = `${HEAD}#
# Starter: a 5 m embankment of granular fill on soft clay in two design cases: the end of
# construction (the clay undrained, its Su growing with depth below the original ground) and
# the long term (the clay drained, once the pore pressures of construction have dissipated).
format: scarpline/1
id: embankment-starter
title: Embankment on soft clay, end of construction and long term (starter)
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
  requiredFs: 1.3     # the requirement of a case that gives none
# Design cases: every case is analyzed, and the section meets its requirement only when every
# case does. A case starts from the settings above and changes what it gives: water, loads,
# seismic and crack replace the section's; materials merge by name (the properties given
# replace the section's, a strength the whole strength); analysis merges setting by setting.
# kind: end-of-construction, long-term, steady-seepage, rapid-drawdown (give drawdown),
# seismic (give earthquake for the displacement), surcharge or other.
cases:
  - name: end of construction
    kind: end-of-construction   # the settings above as they are: the clay undrained
  - name: long term
    kind: long-term
    requiredFs: 1.5             # set by the design case and the governing code
    materials:
      soft-clay:                # drained: c′ and φ′; its unit weight stays as above
        saturatedUnitWeight: 17
        strength: { model: mohr-coulomb, cohesion: 2, frictionAngle: 24 }
`;
