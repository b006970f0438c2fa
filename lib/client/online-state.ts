/**
 * Tells react-query's `onlineManager` the browser's real network state: at start (a page reloaded
 * offline must not believe it is online, or it never sees the network "come back" and waits for
 * the next poll) and on every `online` / `offline` event.
 */
import { onlineManager } from "@tanstack/react-query";

export function followBrowserOnlineState(): void {
  onlineManager.setEventListener((setOnline) => {
    const update = () => setOnline(navigator.onLine);
    update();
    window.addEventListener("online", update);
    window.addEventListener("offline", update);
    return () => {
      window.removeEventListener("online", update);
      window.removeEventListener("offline", update);
    };
  });
}
