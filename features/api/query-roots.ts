/**
 * Roots of the query keys that one feature refreshes for another: acting on a finding in the notice loop
 * changes what the review desk shows, and the notices feature sits below the desk, so it cannot import
 * the desk's key factory. Each feature's factory builds its keys from its root here.
 */
export const reviewRoot = ['review'] as const;
