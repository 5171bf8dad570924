/** How a revision's rows may be ordered in tables and the rows API. */
export const ROW_SORTS = ["idx", "x", "y"] as const;
export type RowSort = (typeof ROW_SORTS)[number];
