import { ambraseysMenu1988 } from './ambraseys-menu-1988';
import { jibson2007 } from './jibson-2007';
import { jibson2007Magnitude } from './jibson-2007-magnitude';
import type { DisplacementRelation } from './sliding-block';

/**
 * The displacement relations a seismic case reports, in this order: Jibson (2007) eq. 6,
 * Jibson (2007) eq. 7 (only when a magnitude is given), Ambraseys & Menu (1988).
 */
export const DISPLACEMENT_RELATIONS: readonly DisplacementRelation[] = [
  jibson2007,
  jibson2007Magnitude,
  ambraseysMenu1988,
];
