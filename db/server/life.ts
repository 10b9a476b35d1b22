/**
 * The operators' running log of their rides (cycles or hours per day), from which each pivot's fatigue
 * damage accumulates (server/pivot-life). Tables added by issue #14.
 */
export {};
