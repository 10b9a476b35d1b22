import type { DocumentPickerAsset } from 'expo-document-picker';

/** The picked file's bytes. On the web the picker hands over the browser's File object. */
export async function readPickedBytes(asset: DocumentPickerAsset): Promise<Uint8Array> {
  if (asset.file) return new Uint8Array(await asset.file.arrayBuffer());
  return new Uint8Array(await (await fetch(asset.uri)).arrayBuffer());
}
