/** Who sees the register's pages: staff. Operators see their rides elsewhere. */
export const staff = ['admin', 'supervisor', 'inspector'] as const;

/** Who changes checklist templates. */
export const editors = ['admin', 'supervisor'] as const;

/** A route parameter as one string, whatever the router hands over (the first of a repeated one). */
export const routeParam = (v: string | string[] | undefined) => (Array.isArray(v) ? (v[0] ?? '') : (v ?? ''));

/** Who plans inspections and assigns them. */
export const planners = ['admin', 'supervisor'] as const;
