/**
 * Paths of the app's pages that are also written outside the app: the server puts them in e-mailed
 * links. Pure (no router), so the server may import it; the app builds its links with each feature's
 * typed `hrefs.ts`, which uses these for the pages named here.
 */

/** A notice's page: where its e-mail and its reminders send the operator. */
export const noticePath = (id: string) => `/notices/${encodeURIComponent(id)}` as const;

/** A ride's NDT plans, due dates and records: where NDT reminders send the operator. */
export const rideNdtPath = (id: string) => `/rides/${encodeURIComponent(id)}/ndt` as const;

/** An absolute link for an e-mail: the app's public address (APP_URL, with or without "/") and a path. */
export const appLink = (appUrl: string, path: `/${string}`) => `${appUrl.replace(/\/+$/, '')}${path}`;
