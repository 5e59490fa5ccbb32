import { useEffect } from 'react';
import { Outlet, useMatches } from 'react-router-dom';
import { SiteFooter } from '@/components/ui/site-footer';
import { SiteHeader } from '@/components/ui/site-header';

/** Each route names its page in `handle.title`; the tab reads "Title · Crosswatt". */
function usePageTitle() {
  const matches = useMatches();
  const title = [...matches]
    .reverse()
    .map((m) => (m.handle as { title?: string } | undefined)?.title)
    .find(Boolean);
  useEffect(() => {
    document.title = title ? `${title} · Crosswatt` : 'Crosswatt';
  }, [title]);
}

export function RootLayout() {
  usePageTitle();
  return (
    <div className="flex min-h-screen flex-col">
      <a
        href="#main"
        className="sr-only focus:not-sr-only focus:absolute focus:left-4 focus:top-4 focus:rounded focus:bg-paper focus:px-3 focus:py-2"
      >
        Skip to content
      </a>
      <SiteHeader />
      <main id="main" className="mx-auto w-full max-w-page flex-1 px-5 py-10 sm:px-8">
        <Outlet />
      </main>
      <SiteFooter />
    </div>
  );
}
