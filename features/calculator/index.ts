/** What other features and the server may use from calculator: runs anywhere (no React Native). */
export { calculatorHref } from '@/features/calculator/hrefs';
