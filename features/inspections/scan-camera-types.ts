/** What the camera view reports: a code it read, and why it cannot show a picture. */
export type CameraTrouble = 'refused' | 'missing' | 'failed';

export type ScanCameraProps = {
  /** The text of a QR code in view (called again for each frame that reads one; the screen decides). */
  onCode: (text: string) => void;
  /** The camera cannot be used: the screen says so and offers typing instead. */
  onTrouble: (trouble: CameraTrouble) => void;
};

export const troubleMessage: Record<CameraTrouble, string> = {
  refused:
    'Pivotwatch may not use the camera. Allow the camera for this app in the phone’s settings, or paste the plate’s address below.',
  missing: 'No camera was found on this device. Paste the plate’s address below instead.',
  failed:
    'The camera could not be started. Close other apps using it and try again, or paste the address below.',
};
