import { operatorChoices, useCompanyListQuery, useSiteListQuery } from '@/features/registry/api';
import { type Option } from '@/features/registry/ride-form';

const LOOKUP = { pageSize: 200, sort: 'name' } as const;

/** Operator companies and sites as the ride form offers them. */
export function useRideFormOptions() {
  const companies = useCompanyListQuery(LOOKUP);
  const sites = useSiteListQuery(LOOKUP);
  const operators: Option[] = operatorChoices(companies.data?.companies);
  const siteOptions: Option[] = (sites.data?.sites ?? []).map((s) => ({
    value: s.id,
    label: s.name,
    hint: s.locality ?? undefined,
    operatorId: s.operatorCompanyId,
  }));
  return {
    ready: !!companies.data && !!sites.data,
    failed: !!companies.error || !!sites.error,
    operators,
    sites: siteOptions,
  };
}
