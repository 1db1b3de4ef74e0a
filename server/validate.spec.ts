import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import { errorHandler } from './error-handler';
import { createLogger } from './logger';
import { validate } from './validate';

function appWith() {
  const app = express();
  app.use(express.json());
  app.post(
    '/items/:id',
    validate({
      params: z.object({ id: z.coerce.number().int().positive() }),
      query: z.object({ page: z.coerce.number().int().min(1).default(1) }),
      body: z.object({ title: z.string().trim().min(1, 'Give the item a title.') }),
    }),
    (req, res) => {
      res.json({ params: req.params, query: req.query, body: req.body as unknown });
    },
  );
  app.use(errorHandler(createLogger('silent')));
  return app;
}

describe('validate', () => {
  it('hands the parsed, coerced and defaulted values to the handler', async () => {
    const res = await request(appWith()).post('/items/7').send({ title: '  Groove  ' });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ params: { id: 7 }, query: { page: 1 }, body: { title: 'Groove' } });
  });

  it('lists every bad field with its path in one 400', async () => {
    const res = await request(appWith()).post('/items/x?page=0').send({ title: ' ' });
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('validation_failed');
    const details = res.body.error.details as { path: string; message: string }[];
    expect(details.map((d) => d.path)).toEqual(['params.id', 'query.page', 'body.title']);
    expect(details[2]?.message).toBe('Give the item a title.');
  });

  it("repeats a few fields' own messages as the error's message, and sums up many", async () => {
    const one = await request(appWith()).post('/items/7').send({ title: ' ' });
    expect(one.body.error.message).toBe('Give the item a title.');
    const many = await request(appWith()).post('/items/x?page=0').send({ title: ' ' });
    expect(many.body.error.message).toMatch(/ Give the item a title\.$/);
    const app = express();
    app.use(express.json());
    const field = (name: string) => z.string({ error: `Give ${name}.` });
    const body = z.object({ a: field('a'), b: field('b'), c: field('c'), d: field('d') });
    app.post('/four', validate({ body }), (_req, res) => {
      res.end();
    });
    app.use(errorHandler(createLogger('silent')));
    const four = await request(app).post('/four').send({});
    expect(four.body.error.message).toBe('Some fields are missing or not valid.');
  });
});
