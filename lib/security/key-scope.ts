/**
 * What an API key may do besides what its creator's role allows (pure: no Next, no database).
 *
 * A key's scope is chosen when it is made and narrows the creator's role; it never widens it: the role
 * check of the route still runs after this one.
 */

export const API_KEY_SCOPES = ["full", "upload", "read"] as const;
export type ApiKeyScope = (typeof API_KEY_SCOPES)[number];

/** Short names, as the keys page shows them. */
export const SCOPE_LABEL: Record<ApiKeyScope, string> = {
  full: "Full",
  upload: "Upload only",
  read: "Read only",
};

/** One line each: what a key with this scope may do. Also the second half of the 403 message. */
export const SCOPE_ALLOWS: Record<ApiKeyScope, string> = {
  full: "everything its creator's current role may do",
  upload:
    "listing and reading fields, uploading files to a field (POST /api/fields/:id/datasets), reading datasets and listing machines",
  read: "reading (GET requests) whatever its creator's role may read",
};

/** One line each for the keys page: what the scope is for and may do. */
export const SCOPE_PURPOSE: Record<ApiKeyScope, string> = {
  full: "acts with everything its creator's current role may do",
  upload: "for a planting machine's nightly push: lists and reads fields, uploads files to a field, reads the files",
  read: "for reporting: reads whatever its creator may read and changes nothing",
};

const READS = new Set(["GET", "HEAD"]);

/** Method and path patterns an upload key may use; `*` is one path segment. */
const UPLOAD_ROUTES: readonly { methods: ReadonlySet<string>; path: readonly string[] }[] = [
  { methods: READS, path: ["api", "fields"] },
  { methods: READS, path: ["api", "fields", "*"] },
  { methods: new Set([...READS, "POST"]), path: ["api", "fields", "*", "datasets"] },
  { methods: READS, path: ["api", "datasets", "*"] },
  { methods: READS, path: ["api", "datasets", "*", "file"] },
  // Machines (issue 13): the push names its machine, so it may list them to find the id.
  { methods: READS, path: ["api", "machines"] },
];

/**
 * May a key with `scope` send a `method` request to `pathname` (no query string)? The creator's role is checked
 * separately. Pages and server actions count too: a page is a GET, an action a POST to the page's path.
 *
 * @example keyScopeAllows("read", "GET", "/api/audits") === true
 * @example keyScopeAllows("upload", "POST", "/api/fields/7f…/datasets") === true
 * @example keyScopeAllows("upload", "POST", "/api/audits") === false
 */
export function keyScopeAllows(scope: ApiKeyScope, method: string, pathname: string): boolean {
  const m = method.toUpperCase();
  switch (scope) {
    case "full":
      return true;
    case "read":
      return READS.has(m);
    case "upload": {
      const segments = pathname.split("/").filter((s) => s !== "");
      if (segments.some((s) => s === "." || s === ".." || s.includes("%"))) return false;
      return UPLOAD_ROUTES.some(
        (r) =>
          r.methods.has(m) &&
          r.path.length === segments.length &&
          r.path.every((p, i) => p === "*" || p === segments[i]),
      );
    }
    default:
      return false;
  }
}

/** The 403 message for a request the key's scope does not cover. */
export function scopeRefusal(scope: ApiKeyScope, method: string, pathname: string): string {
  return `This API key is ${SCOPE_LABEL[scope].toLowerCase()} (scope "${scope}"): it allows ${SCOPE_ALLOWS[scope]}, not ${method.toUpperCase()} ${pathname}.`;
}
