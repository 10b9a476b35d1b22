import { FilterGroup } from '@/components/filter-panel';
import { rideStatusLabel } from '@/components/status-mark';
import { ToggleChips } from '@/components/toggle-chips';
import { type RideClass, rideClasses, rideClassLabel, rideStatuses } from '@/features/rides/schema';

type RideStatus = (typeof rideStatuses)[number];

const rideClassOptions = rideClasses.map((c) => ({ value: c, label: rideClassLabel[c] }));
const rideStatusOptions = rideStatuses.map((s) => ({ value: s, label: rideStatusLabel(s) }));

/** Ride class chips for a list's filters; any number may be on. */
export function RideClassFilter({
  values,
  onChange,
}: {
  values: readonly RideClass[] | undefined;
  onChange: (values: RideClass[]) => void;
}) {
  return (
    <FilterGroup label="Ride class">
      <ToggleChips label="Ride class" values={values ?? []} options={rideClassOptions} onChange={onChange} />
    </FilterGroup>
  );
}

/** Ride status chips for a list's filters; any number may be on. */
export function RideStatusFilter({
  label,
  values,
  onChange,
}: {
  label: string;
  values: readonly RideStatus[] | undefined;
  onChange: (values: RideStatus[]) => void;
}) {
  return (
    <FilterGroup label={label}>
      <ToggleChips label={label} values={values ?? []} options={rideStatusOptions} onChange={onChange} />
    </FilterGroup>
  );
}
