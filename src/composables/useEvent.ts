// The event file's data: GET /api/events/:id as page state.
import { getEvent, type EventDetail } from '../api/events';
import { useAsync } from './useAsync';

export function useEvent() {
  return useAsync<EventDetail, [number]>(getEvent);
}
