/** What other features and the server may use from instruments: runs anywhere (no React Native). */
export { writeDeclarationSetting, writeInstruments } from '@/features/instruments/device-cache';
export { unstatedMethodProblems } from '@/features/instruments/unstated';
