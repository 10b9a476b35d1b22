/** Android's accelerometer reads specific force (face up: z = +1 g), the recording's own convention. */
export const ACCEL_SIGN: 1 | -1 = 1;
