import "server-only";
import { officeAddresses } from "@/db/customer-contact/messages";
import { emailContext } from "@/db/office/emails";
import { enqueueMails } from "./mail";
import { officeConfig } from "./office-config";
import type { Db } from "@/db/setup/client";

// E-mails of a job's thread and its progress updates, queued in the outbox (sent by the queue
// worker, never from a read): a customer's message to the shop's office sign-ins, the office's
// reply and a progress update to the customer's address on file.

const excerpt = (text: string) => (text.length > 1500 ? `${text.slice(0, 1500)}…` : text);

export async function mailCustomerMessage(db: Db, shopId: string, workOrderId: string, messageId: string, body: string) {
  const c = await emailContext(db, shopId, workOrderId);
  const to = await officeAddresses(db, shopId);
  if (!c || !to.length) return [];
  const link = `${officeConfig().NEXTAUTH_URL}/office/work-orders/${workOrderId}#customer-thread`;
  return enqueueMails(
    db,
    to.map((address) => ({
      shopId,
      workOrderId,
      kind: "customer_message",
      cause: `message:${messageId}`,
      to: address,
      subject: `${c.customerName} asks about work order ${c.number}`,
      text: `${c.customerName} wrote about the ${c.make} ${c.model} (${c.tagCode}), work order ${c.number}:\n\n${excerpt(body)}\n\nAnswer on the work order: ${link}`,
    })),
  );
}

async function toCustomer(
  db: Db,
  shopId: string,
  workOrderId: string,
  kind: string,
  cause: string,
  write: (c: Context) => { subject: string; text: string },
) {
  const c = await emailContext(db, shopId, workOrderId);
  if (!c?.email) return { queued: false as const, reason: "The customer has no e-mail address on file, so no e-mail was sent." };
  await enqueueMails(db, [{ shopId, workOrderId, kind, cause, to: c.email, ...write(c) }]);
  return { queued: true as const };
}
type Context = NonNullable<Awaited<ReturnType<typeof emailContext>>>;

export async function mailOfficeReply(db: Db, shopId: string, workOrderId: string, messageId: string, body: string) {
  return toCustomer(db, shopId, workOrderId, "office_reply", `message:${messageId}`, (c) => ({
    subject: `Reply about your ${c.make} ${c.model} (work order ${c.number})`,
    text: `Hello ${c.customerName},\n\n${excerpt(body)}\n\nReply or see the whole conversation when signed in: ${officeConfig().NEXTAUTH_URL}/my-bikes\n\n${c.shopName}`,
  }));
}

export async function mailProgressUpdate(db: Db, shopId: string, workOrderId: string, updateId: string, note: string, photos: number) {
  return toCustomer(db, shopId, workOrderId, "progress_update", `progress:${updateId}`, (c) => ({
    subject: `News on your ${c.make} ${c.model} (work order ${c.number})`,
    text: `Hello ${c.customerName},\n\n${excerpt(note)}\n\n${photos ? `${photos === 1 ? "A photo is" : `${photos} photos are`} on your bike's page` : "More on your bike's page"}: ${officeConfig().NEXTAUTH_URL}/my-bikes\n\n${c.shopName}`,
  }));
}
