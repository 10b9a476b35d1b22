/**
 * A phone's app is one bundle (nothing to fetch later), and jest runs without `import()`: the bundles are
 * plain imports here. The web splits at the same modules (bundle-loaders.web.ts).
 */
import * as accountBundle from '@/features/shell/bundles/account';
import * as adminBundle from '@/features/shell/bundles/admin';
import * as calculatorBundle from '@/features/shell/bundles/calculator';
import * as frameBundle from '@/features/shell/bundles/frame';
import * as inspectorBundle from '@/features/shell/bundles/inspector';
import * as noticesBundle from '@/features/shell/bundles/notices';
import * as operatorBundle from '@/features/shell/bundles/operator';
import * as reviewBundle from '@/features/shell/bundles/review';
import * as ridesBundle from '@/features/shell/bundles/rides';
import * as scanBundle from '@/features/shell/bundles/scan';

export const frame = async () => frameBundle;
export const inspector = async () => inspectorBundle;
export const review = async () => reviewBundle;
export const rides = async () => ridesBundle;
export const notices = async () => noticesBundle;
export const operator = async () => operatorBundle;
export const admin = async () => adminBundle;
export const calculator = async () => calculatorBundle;
export const account = async () => accountBundle;
export const scan = async () => scanBundle;
