// Lets code outside React (the API client) move the router without importing it.
type Navigate = (to: string, options?: { replace?: boolean }) => void;

const fallback: Navigate = (to, options) => {
  if (options?.replace) window.location.replace(to);
  else window.location.assign(to);
};

let current: Navigate = fallback;

export function setNavigator(navigate: Navigate | null) {
  current = navigate ?? fallback;
}

export function navigateTo(to: string, options?: { replace?: boolean }) {
  current(to, options);
}

/** Leaves the app for another site (the payment service's page): a full page load, never the router. */
export function leaveFor(url: string) {
  window.location.assign(url);
}
