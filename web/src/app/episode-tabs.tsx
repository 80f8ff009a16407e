import { lazy, type ComponentType, type LazyExoticComponent } from 'react';

/** What every tab of the episode page receives. */
export interface EpisodeTabProps {
  episodeId: string;
  channelId: string;
}

/** A tab of the episode page; each feature owns its tab component (loaded lazily). */
export interface EpisodeTab {
  key: 'plan' | 'footage' | 'readouts' | 'description' | 'schedule';
  label: string;
  Component: LazyExoticComponent<ComponentType<EpisodeTabProps>> | null;
}

/** Helper for a tab module that default-exports its component (declared before the list that calls it). */
export const lazyTab = (load: () => Promise<{ default: ComponentType<EpisodeTabProps> }>) => lazy(load);

// The app composes features here; a feature adds its line when its tab exists. `null` = not built yet.
export const EPISODE_TABS: EpisodeTab[] = [
  { key: 'plan', label: 'Plan', Component: lazyTab(() => import('../features/plans/components/plan-tab.tsx')) },
  { key: 'footage', label: 'Footage', Component: lazyTab(() => import('../features/footage/components/footage-tab.tsx')) },
  { key: 'readouts', label: 'Readouts', Component: lazyTab(() => import('../features/readouts/components/readouts-tab.tsx')) },
  { key: 'description', label: 'Description', Component: lazyTab(() => import('../features/publishing/components/description-tab.tsx')) },
  { key: 'schedule', label: 'Schedule', Component: lazyTab(() => import('../features/publishing/components/schedule-tab.tsx')) },
];
