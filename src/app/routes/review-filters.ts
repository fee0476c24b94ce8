import { REVIEW_SORTS, type ReviewQuery } from '#shared/api/review';
import { FLAG_KINDS } from '#shared/projection/project';

/** The review list's filters live in the URL. */
export function reviewFilters(sp: URLSearchParams): ReviewQuery {
  const get = (k: string): string | undefined => sp.get(k) || undefined;
  const sort = get('sort');
  return {
    view: get('view') === 'all-flagged' ? 'all-flagged' : 'needs-decision',
    jobId: get('jobId'),
    productType: get('productType'),
    flag: (FLAG_KINDS as readonly string[]).includes(get('flag') ?? '') ? (get('flag') as ReviewQuery['flag']) : undefined,
    bay: get('bay'),
    sort: (REVIEW_SORTS as readonly string[]).includes(sort ?? '') ? (sort as ReviewQuery['sort']) : 'urgency',
    dir: 'asc',
    page: Number(get('page') ?? 1) || 1,
    pageSize: 50,
  };
}
