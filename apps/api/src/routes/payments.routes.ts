// The payments provider's webhook. It needs the raw body (the signature covers the bytes as
// sent), so it is mounted before the API's JSON parser and declared here by hand, not through
// api.route, which validates parsed JSON.
import express from 'express';
import { z } from 'zod';
import { ProblemDetailsSchema } from '@emberline/domain';
import type { AppContext } from '../app-context';
import type { ApiRouter } from '../lib/api-router';
import { WEBHOOK_SIGNATURE_HEADER } from '../payments/gateway';
import { processPaymentEvent } from '../services/payment-events.service';

export const WEBHOOK_PATH = '/payments/webhook';

/** Call before the API router's JSON parser is added. */
export function registerPaymentWebhook(api: ApiRouter, app: AppContext): void {
  api.router.post(WEBHOOK_PATH, express.raw({ type: 'application/json', limit: '1mb' }), async (req, res, next) => {
    try {
      const raw = Buffer.isBuffer(req.body) ? req.body : Buffer.alloc(0);
      const event = app.payments.verifyWebhook(raw, req.get(WEBHOOK_SIGNATURE_HEADER));
      const outcome = await processPaymentEvent({ dataSource: app.dataSource, payments: app.payments, publicUrl: app.config.publicUrl, logger: req.log }, event);
      res.status(200).json({ data: { received: true, duplicate: outcome === 'duplicate' } });
    } catch (err) {
      next(err);
    }
  });

  const problem = (description: string) => ({ description, content: { 'application/problem+json': { schema: ProblemDetailsSchema } } });
  api.registry.registerPath({
    method: 'post',
    path: `${api.mountPath}${WEBHOOK_PATH}`,
    operationId: api.operationId('post', `${api.mountPath}${WEBHOOK_PATH}`),
    // no bearer token: the provider's signature over the body authenticates it
    security: [],
    summary: 'Events from the payments provider (for the provider only)',
    description:
      'Note: not for clients. The body is the provider\'s event JSON, read raw and verified against the signature header the provider sends; a bad or missing signature is 400 and changes nothing. Each event is applied once, by its id: a repeated delivery answers 200 with `duplicate: true`. A failure to apply it (e.g. the provider unreachable) answers 5xx, so the provider delivers it again.',
    tags: ['Payments'],
    request: { body: { content: { 'application/json': { schema: z.object({ id: z.string(), type: z.string() }).passthrough() } } } },
    responses: {
      200: { description: 'Received', content: { 'application/json': { schema: z.object({ data: z.object({ received: z.literal(true), duplicate: z.boolean() }) }) } } },
      400: problem('The signature does not verify'),
      500: problem('Unexpected error'),
      503: problem('The payments provider could not be reached while applying the event'),
    },
  });
}
