/** What other features may use from the calculator: everything else in the folder is its own. */
export { calculatorHref } from '@/features/calculator/hrefs';
