/**
 * Every SWR key of the app, in one place. A key is the API path the data is read from (the fetcher is
 * `fetchJson` from lib/api-client.ts), so a page's server-seeded `fallback` and a later `mutate` always name the
 * same entry. Build keys only here; never spell an API path inline in a useSWR or mutate call.
 */
const seg = encodeURIComponent;

export const swrKeys = {
  /** `{ members, you }` of a team. */
  teamMembers: (teamId: string) => `/api/teams/${seg(teamId)}/members`,
  /** `{ invites }` of a team (owners only). */
  teamInvites: (teamId: string) => `/api/teams/${seg(teamId)}/invites`,
  /** `{ baseline, role }`: the baseline with its classes. */
  baseline: (baselineId: string) => `/api/baselines/${seg(baselineId)}`,
  /** `{ baseline, role }` with each class's (coarsened) length histogram, as the scenario editor evaluates it. */
  baselineWithHistograms: (baselineId: string) => `/api/baselines/${seg(baselineId)}?histograms=1`,
  /** `{ warnings }`: the open warnings imports left on a baseline (DELETE `<key>/<warningId>` dismisses one). */
  baselineWarnings: (baselineId: string) => `/api/baselines/${seg(baselineId)}/warnings`,
  /** `{ revisions }` of a baseline; the version makes a new key after every save, so the list reloads. */
  baselineRevisions: (baselineId: string, version: number) => `/api/baselines/${seg(baselineId)}/revisions?v=${version}`,
  /** `{ scenario, role }`. */
  scenario: (scenarioId: string) => `/api/scenarios/${seg(scenarioId)}`,
  /** `{ revisions }` of a scenario, keyed by its current version like baselineRevisions. */
  scenarioRevisions: (scenarioId: string, version: number) => `/api/scenarios/${seg(scenarioId)}/revisions?v=${version}`,
  /** `{ roadmap, role }`. */
  roadmap: (roadmapId: string) => `/api/roadmaps/${seg(roadmapId)}`,
  /** `{ revisions }`, newest first; keyed by the current version so a save refetches. */
  roadmapRevisions: (roadmapId: string, version: number) => `/api/roadmaps/${seg(roadmapId)}/revisions?v=${version}`,
  /** `{ links }`: a report's share links (editors and owners). */
  reportShareLinks: (reportId: string) => `/api/reports/${seg(reportId)}/share-links`,
} as const;
