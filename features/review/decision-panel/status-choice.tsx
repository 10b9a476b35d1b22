import { View } from 'react-native';

import { type RideStatus, RideStatusMark, rideStatusLabel } from '@/components/status-mark';
import { RadioGroup, RadioOption } from '@/components/radio-option';
import { Text } from '@/components/text';
import { TextField } from '@/components/text-field';
import { sharedStyles } from '@/features/review/decision-panel/styles';

/** The ride's status sent with the decision: kept as it is, or made stricter by this decision. */
export type StatusChoice = 'keep' | 'out_of_service' | 'restricted';

/** The ride's status to send with the decision, and the reason the operator reads with it. */
export function StatusChoiceField({
  rideStatus,
  choice,
  onChoose,
  reason,
  onReasonChange,
  reasonError,
}: {
  rideStatus: RideStatus;
  choice: StatusChoice;
  onChoose: (choice: StatusChoice) => void;
  reason: string;
  onReasonChange: (reason: string) => void;
  reasonError: string | undefined;
}) {
  // The stricter statuses this decision may set; easing a stop is the follow-up's or an override's.
  const stricter = (['restricted', 'out_of_service'] as const).filter(
    (s) => s !== rideStatus && !(rideStatus === 'out_of_service' && s === 'restricted'),
  );
  const offered: StatusChoice[] = ['keep', ...stricter];
  return (
    <View style={sharedStyles.section}>
      <Text variant="label" muted>
        RIDE STATUS WITH THIS DECISION
      </Text>
      <RadioGroup
        label="Ride status with this decision"
        value={choice}
        values={offered}
        onChange={onChoose}
        style={sharedStyles.buttons}
      >
        {offered.map((c) => {
          const label =
            c === 'keep'
              ? `Keep ${rideStatusLabel(rideStatus).toLowerCase()}`
              : `Set ${rideStatusLabel(c).toLowerCase()}`;
          return (
            <RadioOption key={c} value={c} label={label}>
              {c === 'keep' ? <Text>{label}</Text> : <RideStatusMark status={c} compact />}
            </RadioOption>
          );
        })}
      </RadioGroup>
      {choice !== 'keep' ? (
        <TextField
          label="Reason for the status"
          hint="The operator reads it on the decision’s notice, with the findings and values behind it."
          value={reason}
          onChangeText={onReasonChange}
          error={reasonError}
          multiline
        />
      ) : (
        <Text variant="small" muted>
          One decision, one notice: a status set here goes on the approval’s notice to the operator.
          {rideStatus !== 'in_service'
            ? ' Approving a follow-up inspection returns the ride to service when nothing forbids operation.'
            : ''}
        </Text>
      )}
    </View>
  );
}
