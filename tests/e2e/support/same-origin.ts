// Playwright's `request` fixtures (and page.request) do not send an Origin header the way a page's
// own fetch does; the route wrapper refuses a state-changing request without one (app/_server/
// same-origin.ts). Tests that post through them send this, as our pages would.
const port = Number(process.env.E2E_PORT ?? 3100);
export const APP_ORIGIN = `http://localhost:${port}`;
export const fromOurPage = { origin: APP_ORIGIN };
