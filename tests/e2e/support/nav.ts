import type { Page } from "@playwright/test";

/** Follows a link of the header: in its row, or under "More" (opened first) when it is there. */
export async function goByHeader(page: Page, label: string) {
  const nav = page.getByRole("navigation", { name: "Main" });
  const link = nav.getByRole("link", { name: label, exact: true });
  if (!(await link.isVisible())) await nav.getByText("More").click();
  await link.click();
}
