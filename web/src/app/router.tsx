import { createBrowserRouter, Navigate } from 'react-router-dom';
import { SignInPage } from '../features/auth/components/sign-in-page.tsx';
import { RouteError } from './route-error.tsx';
import { Shell } from './shell.tsx';

// Pages load lazily so the first page stays small; each feature owns its page component.
export const router = createBrowserRouter([
  { path: '/sign-in', element: <SignInPage /> },
  { path: '/mailbox', lazy: async () => ({ Component: (await import('../features/mailbox/components/mailbox-page.tsx')).MailboxPage }) },
  {
    path: '/',
    element: <Shell />,
    errorElement: <RouteError />,
    children: [
      { index: true, element: <Navigate to="/board" replace /> },
      { path: 'board', lazy: async () => ({ Component: (await import('../features/board/components/board-page.tsx')).BoardPage }) },
      { path: 'episodes/:id', lazy: async () => ({ Component: (await import('../features/board/components/episode-page.tsx')).EpisodePage }) },
      { path: 'archive', lazy: async () => ({ Component: (await import('../features/board/components/archive-page.tsx')).ArchivePage }) },
      { path: 'gear', lazy: async () => ({ Component: (await import('../features/gear/components/gear-page.tsx')).GearPage }) },
      { path: 'calendar', lazy: async () => ({ Component: (await import('../features/calendar/components/calendar-page.tsx')).CalendarPage }) },
      { path: 'approvals', lazy: async () => ({ Component: (await import('../features/publishing/components/approvals-page.tsx')).ApprovalsPage }) },
      { path: 'profile', lazy: async () => ({ Component: (await import('../features/profile/components/profile-page.tsx')).ProfilePage }) },
      { path: 'episodes/:id/shot-list', lazy: async () => ({ Component: (await import('../features/plans/components/shot-list-page.tsx')).ShotListPage }) },
      { path: 'compare', lazy: async () => ({ Component: (await import('../features/readouts/components/compare-page.tsx')).ComparePage }) },
      { path: 'team', lazy: async () => ({ Component: (await import('../features/team/components/team-page.tsx')).TeamPage }) },
      { path: '*', element: <RouteError /> },
    ],
  },
]);
