// Narrowing a loose value (a form field, a select's value, a query parameter) to one of a list of
// literals, without a cast.

/** `isOneOf(CATEGORIES, form.get("category"))` narrows the value to Category. */
export function isOneOf<const T>(list: readonly T[], value: unknown): value is T {
  return list.some((item) => item === value);
}
