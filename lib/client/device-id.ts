/** This browser's device id, made once and kept in localStorage (shared by everyone using the tablet). */
export function deviceId(): string {
  const key = "benchtag-device-id";
  let id = localStorage.getItem(key);
  if (!id) {
    id = `tab-${crypto.randomUUID().slice(0, 18)}`;
    localStorage.setItem(key, id);
  }
  return id;
}
