import { Card } from '@/components/card';
import { Text } from '@/components/text';
import { PaperSizeDownload, downloadPdf, pdfFileName } from '@/features/api/ui';

/**
 * The admin's sheet of plates as a PDF (GET /api/plates.pdf): a QR label for each ride and each of its
 * pivots, to print on A4 or US Letter and fix on the ride. One ride's (`ride`) or the whole register's.
 */
export function PlateSheetDownload({ ride }: { ride?: { id: string; name: string } }) {
  return (
    <Card accessibilityLabel="QR plates">
      <Text variant="heading">QR plates</Text>
      <Text variant="small" muted>
        {ride
          ? `A label with a QR code for ${ride.name} and one for each of its pivots, named in words too.`
          : 'A label with a QR code for each ride and each pivot in the register, named in words too.'}{' '}
        An inspector’s Scan on Today, or any phone camera, opens Pivotwatch there.
      </Text>
      <PaperSizeDownload
        label="Plates"
        what={ride ? `the plates of ${ride.name} and its pivots` : 'the plates of every ride and pivot'}
        progressLabel="Sheet of plates"
        failure="The sheet could not be fetched."
        offline="No connection: the server makes the sheet, so try again when you are online."
        fetch={(size, onProgress) =>
          downloadPdf(
            `/api/plates.pdf?size=${size}${ride ? `&rideId=${encodeURIComponent(ride.id)}` : ''}`,
            pdfFileName(ride ? `plates-${ride.name}` : 'plates', size),
            onProgress,
          )
        }
      />
    </Card>
  );
}
