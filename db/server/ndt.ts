/**
 * NDT records per pivot (method, technician, result, report PDF by SHA-256) and each ride's pivot-life
 * flags the review queue reads (earliest NDT due date, earliest projected wear limit). Tables added by
 * issue #14.
 */
export {};
