/** Writes a field (GSM nT) at a GSM point (RE) into out[0..2]. */
export type FieldWriter = (out: Float64Array, x: number, y: number, z: number) => void;
