/** Number of the first page in the API's `page` parameter (Page<T>.page). */
export const FIRST_PAGE = 1;
