import Head from 'expo-router/head';

/**
 * The browser tab's title. Expo Router's Head (react-helmet-async, its provider is in the router's own
 * entry, so it works in this single-page export) keeps the title of the innermost one mounted: a screen's
 * heading, once it has loaded, wins over its route's plain title.
 */
export function PageHead({ title }: { title: string }) {
  return (
    <Head>
      <title>{title}</title>
    </Head>
  );
}
