/** Thrown inside the dual route when a decision falls within the margin; caught at its top (dual.ts). */
export class Undecided extends Error {}
