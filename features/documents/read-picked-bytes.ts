import type { DocumentPickerAsset } from 'expo-document-picker';
import { File } from 'expo-file-system';

/** The picked file's bytes, from the copy the picker made in the app's cache. */
export async function readPickedBytes(asset: DocumentPickerAsset): Promise<Uint8Array> {
  return new Uint8Array(await new File(asset.uri).arrayBuffer());
}
