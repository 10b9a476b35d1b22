/** iOS's accelerometer reads the opposite of specific force (face up: z = −1 g), so it is turned round. */
export const ACCEL_SIGN: 1 | -1 = -1;
