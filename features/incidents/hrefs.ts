/** Links to an incident report's page (a ride's reports and the form are under `/rides/…`). */
import type { Href } from 'expo-router';

export const incidentHref = (id: string) => `/incidents/${encodeURIComponent(id)}` as const satisfies Href;
