import { HEAD, SURFACE_NOTE } from './common';

/** An embankment on soft clay with a basal geotextile, asking for the basal force it needs. */
export const reinforcedEmbankment = `${HEAD}#
# Starter: a 7 m embankment (half section, side slope 1 : 2) on 9 m of soft clay whose Su grows
# with depth, with a basal geotextile on a thin working platform; end of construction, the clay
# undrained. The analysis also asks how much more basal force would meet the required FS.
format: scarpline/1
id: reinforced-embankment-starter
title: Embankment on soft clay with a basal geotextile, end of construction (starter)
station: 0          # chainage of the section (m)
offset: 0           # x of the alignment (centreline) in this section
units: si           # si: m, kN, kPa, kN/m³   us: ft, lbf, psf, pcf
ground: [[0, 17.5], [12, 17.5], [26, 10.5], [70, 10.5]]
materials:
  fill:
    description: Compacted granular fill
    unitWeight: 20
    strength: { model: mohr-coulomb, cohesion: 0, frictionAngle: 35 }
  soft-clay:
    description: Soft grey silty CLAY; Su from vane tests
    unitWeight: 16.5
    strength: { model: undrained, su: 20, suRate: 1.6, suDatum: 10.5 }
  gravel:
    description: Dense GRAVEL; no slip surface is expected to pass through it
    strength: { model: rigid }
strata:
  - { material: fill }
  - { material: soft-clay, top: 10.5 }
  - { material: gravel, top: 1.5 }
water:
  piezometric: 10
# Reinforcement: geosynthetic (a level line or points), nail, anchor or pile (see the README's
# "Reinforcement"). Where the slip surface crosses an element, the least of its strength and its
# pullout behind and in front acts on the slice it crosses. dividedByF: true (the default but for
# an anchor applied as a load) takes the force as a resistance, divided by F with the soil's.
reinforcement:
  - type: geosynthetic
    name: basal geotextile
    elevation: 11     # on the working platform
    from: 0
    to: 25            # ends 0.5 m inside the side slope
    strength: 200     # long-term design strength after reduction factors (kN per m run)
    interaction: 0.8  # Ci: the soil–geotextile shear strength over the soil's
    # coverage: 1     # Rc: the share of the run the layer covers
analysis:
  methods: [bishop, spencer]
  slices: 40
${SURFACE_NOTE}
  surface: { type: auto }
  case: end-of-construction
  requiredFs: 1.3     # set by the design case and the governing code
  # Below the required FS: the further uniform force at this level that meets it (a full search
  # at every step). Or layers of a product: { level: 11, product: { strength: 60, interaction:
  # 0.8 }, spacing: 0.5 }.
  requiredReinforcement: { level: 11, from: 0, to: 25 }
`;
