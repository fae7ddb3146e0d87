import { apiHandler, json, readBodyText } from '@/lib/server/http';
import { handleWebhook } from '@/lib/server/payments';

export const dynamic = 'force-dynamic';

/**
 * Payment-service webhooks. The raw body is verified against the Stripe-Signature header;
 * a bad or missing signature is a 400 and changes nothing.
 */
export const POST = apiHandler(async (req: Request) => {
  const payload = await readBodyText(req, 256 * 1024);
  return json(await handleWebhook(payload, req.headers.get('stripe-signature')));
}, { csrf: false }); // server-to-server; the signature is the check
