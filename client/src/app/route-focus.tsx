/**
 * Each page gets a title of its own, and after moving to another page (signing in, opening a survey)
 * keyboard and screen-reader focus goes to the new page's heading instead of falling to <body>.
 */
import { useEffect, useRef } from 'react';
import { matchPath, useLocation } from 'react-router';
import { paths } from '@client/config/paths';

const TITLES: readonly [pattern: string, title: string][] = [
  [paths.home, 'Welcome'],
  [paths.signIn, 'Sign in'],
  [paths.forgotPassword, 'Forgotten password'],
  [paths.resetPassword, 'New password'],
  [paths.acceptInvitation, 'Accept invitation'],
  [paths.members, 'Members'],
  [paths.devMail, 'Development mailbox'],
  [paths.surveys, 'Surveys on this device'],
  [paths.surveyPattern, 'Survey workspace'],
  [paths.review, 'Review queue'],
  [paths.reviewSurveyPattern, 'Review desk'],
];

/** The page's own name, then the product's (the tab strip shows the first words). */
export function titleFor(pathname: string): string {
  const hit = TITLES.find(([pattern]) => matchPath(pattern, pathname));
  return `${hit?.[1] ?? 'Page not found'} · Brineline`;
}

/** Focuses the page's first heading once it has rendered (lazy routes and data arrive a little later). */
function focusHeading(main: HTMLElement): () => void {
  let tries = 0;
  const timer = setInterval(() => {
    const h1 = main.querySelector<HTMLElement>('h1');
    if (h1 || ++tries > 20) {
      clearInterval(timer);
      const target = h1 ?? main;
      if (!target.hasAttribute('tabindex')) target.setAttribute('tabindex', '-1');
      // Someone already working in the new page (typing in a field) keeps their place.
      if (document.activeElement === document.body || document.activeElement === null || !main.contains(document.activeElement)) target.focus({ preventScroll: true });
    }
  }, 100);
  return () => clearInterval(timer);
}

export function RouteFocus({ mainId }: { mainId: string }) {
  const { pathname } = useLocation();
  const first = useRef(true);
  useEffect(() => {
    document.title = titleFor(pathname);
    if (first.current) {
      first.current = false;
      return;
    }
    const main = document.getElementById(mainId);
    return main ? focusHeading(main) : undefined;
  }, [pathname, mainId]);
  return null;
}
