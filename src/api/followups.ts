// Follow-ups across events: overdue, due this week, or every open one (GET /api/follow-ups).
import type { FollowUpDue } from '../../shared/schemas/enums';
import type { FollowUpListItem, FollowUpListPage } from '../../shared/schemas/responses';
import { api } from './client';

export type { FollowUpDue, FollowUpListItem, FollowUpListPage };

export interface FollowUpListQuery {
  due?: FollowUpDue;
  siteId?: number;
  page?: number;
  pageSize?: number;
}

// GET /api/follow-ups — one page of open follow-ups of a due bucket, each with its event, unit and site.
export function listFollowUps(query: FollowUpListQuery = {}, signal?: AbortSignal): Promise<FollowUpListPage> {
  return api.get<FollowUpListPage>('/follow-ups', { query: { ...query }, signal });
}
