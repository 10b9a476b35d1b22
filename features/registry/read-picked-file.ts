import type { DocumentPickerAsset } from 'expo-document-picker';
import { File } from 'expo-file-system';

/** The picked file's text, from the copy the picker made in the app's cache. */
export async function readPickedFile(asset: DocumentPickerAsset): Promise<string> {
  return new File(asset.uri).text();
}
