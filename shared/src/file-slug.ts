/** Returns `title` as a file-name slug: lower-case ASCII letters, digits and dashes, at most 60 characters ('' if none). */
export function fileSlug(title: string): string {
  return title
    .normalize('NFKD')
    .replace(/[\u0300-\u036f]/g, '')
    .toLowerCase()
    .replace(/[^a-z0-9]+/g, '-')
    .replace(/^-+|-+$/g, '')
    .slice(0, 60);
}
