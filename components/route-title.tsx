import { type ReactNode, createContext, useContext } from 'react';

import { PageHead } from '@/components/page-head';

const PRODUCT = 'Pivotwatch';

/** What a page's heading block shows (PageTitle): the heading and the line under it. */
export type Heading = { title: string; subtitle?: string };
/** Finds the page's object (a ride, an inspection, a person, a notice…) in its heading, if it is there. */
export type ObjectRule = (heading: Heading) => string | undefined;
/** A route's title: the name of the page, and where its object's name is once the screen has loaded. */
export type RouteTitle = { page: string; object?: ObjectRule };

/** "Tidebreaker — Review · Pivotwatch": the object first, then the page, then the product. */
export function composeTitle(page: string, object?: string): string {
  return object ? `${object} — ${page} · ${PRODUCT}` : `${page} · ${PRODUCT}`;
}

/** The object is the heading itself (a ride's page is headed by the ride's name). */
export const objectIsHeading: ObjectRule = ({ title }) => title;

/** The object leads the subtitle ("Tidebreaker · submitted …" under "Periodic inspection"). */
export const objectLeadsSubtitle: ObjectRule = ({ subtitle }) => subtitle?.split(' · ')[0];

/** The object follows a fixed opening of the heading ("Schedule of Tidebreaker", "Edit Tidebreaker"). */
export const objectAfter =
  (opening: string): ObjectRule =>
  ({ title }) =>
    title.startsWith(opening) ? title.slice(opening.length) : undefined;

/** A heading that says the object is missing ("Ride not found", "No such version") names the tab itself. */
const missing = (title: string) => /\bnot found$/i.test(title) || /^no such /i.test(title);

/**
 * The title for a route once its heading is shown. While a screen waits for its object its heading is
 * the page's own name ("Notice", "Person"): then the title is the page's alone.
 */
export function titleFromHeading(route: RouteTitle, heading: Heading): string {
  if (missing(heading.title)) return composeTitle(heading.title);
  const object = route.object?.(heading)?.trim();
  const named = object && object.toLowerCase() !== route.page.toLowerCase() ? object : undefined;
  return composeTitle(route.page, named);
}

const RouteTitleContext = createContext<RouteTitle | null>(null);

/**
 * A route's screen with its title: the page's name as soon as the route renders (while the screen's code
 * and data load), and the object's name from the heading once PageTitle shows it. Route files stay one
 * statement: `export default titled(Screen, { page: 'Review', object: objectLeadsSubtitle })`.
 */
export function titled<P extends object>(
  Screen: (props: P) => ReactNode,
  route: RouteTitle,
): (props: P) => ReactNode {
  function Titled(props: P) {
    return (
      <RouteTitleContext.Provider value={route}>
        <PageHead title={composeTitle(route.page)} />
        <Screen {...props} />
      </RouteTitleContext.Provider>
    );
  }
  Titled.displayName = `Titled(${route.page})`;
  return Titled;
}

/** Called by PageTitle: the title with the object named by the heading it shows (nothing outside a route). */
export function HeadingTitle(heading: Heading) {
  const route = useContext(RouteTitleContext);
  if (!route) return null;
  return <PageHead title={titleFromHeading(route, heading)} />;
}
