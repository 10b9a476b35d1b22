/**
 * Links to the register's pages (`/register/…`): companies, sites, checklist templates, schedules,
 * instruments and the audit log (a ride's own pages are in `features/rides/hrefs.ts`). `satisfies Href`
 * has tsc check each against `app/` (typed routes).
 */
import type { Href } from 'expo-router';

const company = (id: string) => `/register/companies/${encodeURIComponent(id)}` as const;
const site = (id: string) => `/register/sites/${encodeURIComponent(id)}` as const;
const checklist = (id: string) => `/register/checklists/${encodeURIComponent(id)}` as const;

export const companiesHref = '/register/companies' as const satisfies Href;
export const newCompanyHref = '/register/companies/new' as const satisfies Href;
export const companyHref = (id: string) => company(id) satisfies Href;
export const companyEditHref = (id: string) => `${company(id)}/edit` as const satisfies Href;

export const sitesHref = '/register/sites' as const satisfies Href;
export const newSiteHref = '/register/sites/new' as const satisfies Href;
export const siteHref = (id: string) => site(id) satisfies Href;
export const siteEditHref = (id: string) => `${site(id)}/edit` as const satisfies Href;

export const checklistsHref = '/register/checklists' as const satisfies Href;
/** A new template, started for one ride class. */
export const newChecklistHref = (rideClass: string) =>
  `/register/checklists/new?rideClass=${encodeURIComponent(rideClass)}` as const satisfies Href;
export const checklistHref = (id: string) => checklist(id) satisfies Href;
export const checklistEditHref = (id: string) => `${checklist(id)}/edit` as const satisfies Href;
export const checklistVersionHref = (id: string, version: number) =>
  `${checklist(id)}/versions/${version}` as const satisfies Href;

const bulletin = (id: string) => `/register/bulletins/${encodeURIComponent(id)}` as const;
export const bulletinsHref = '/register/bulletins' as const satisfies Href;
export const newBulletinHref = '/register/bulletins/new' as const satisfies Href;
export const bulletinHref = (id: string) => bulletin(id) satisfies Href;
export const bulletinEditHref = (id: string) => `${bulletin(id)}/edit` as const satisfies Href;

export const schedulesHref = '/register/schedules' as const satisfies Href;
export const roundsHref = '/register/rounds' as const satisfies Href;
export const instrumentsHref = '/register/instruments' as const satisfies Href;
/** The audit log, or one ride's part of it. */
export const auditHref = (rideId?: string) =>
  (rideId
    ? (`/register/audit?rideId=${encodeURIComponent(rideId)}` as const)
    : '/register/audit') satisfies Href;
