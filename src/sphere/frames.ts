/**
 * Celestial frames as typed values. skyspan knows two: Galactic and equatorial
 * (ICRS, J2000 axes). A map whose file does not say its frame has frame
 * 'unknown'; commands that need the frame ask for it with an option.
 * The rotation between frames lives in `frameRotation.ts`.
 */

/** Frame names as used in the API and in region files. */
export type FrameName = 'galactic' | 'equatorial' | 'unknown';

/** A frame with its epoch: equatorial is ICRS (J2000 axes). */
export interface Frame {
  readonly name: FrameName;
  readonly epoch: 'J2000' | null;
}

/** The Galactic frame (l, b), J2000 axes. */
export const GALACTIC: Frame = { name: 'galactic', epoch: 'J2000' };
/** The equatorial frame (RA, Dec), ICRS. */
export const EQUATORIAL: Frame = { name: 'equatorial', epoch: 'J2000' };
/** A map whose file does not state its frame. */
export const UNKNOWN_FRAME: Frame = { name: 'unknown', epoch: null };
