import { describe, expect, it } from 'vitest';
import { limitDefaults } from '../server/auth/rateLimit.js';
import { makeTestApp, testPassword } from './helpers/app.js';

const fifteenMinutesSeconds = 15 * 60;

describe('sign-in rate limits', () => {
  it('after 5 wrong passwords for one account answers 429 with Retry-After, even to the right password', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const client = t.agent();
    for (let i = 0; i < limitDefaults.signInPerAccount.max; i++) {
      await client.post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: `guess number ${i}` }).expect(401);
    }
    const res = await client.post('/api/auth/sign-in').send({ email: 'ADA@lab.example', password: testPassword });
    expect(res.status).toBe(429);
    const retryAfter = Number(res.headers['retry-after']);
    expect(retryAfter).toBeGreaterThan(fifteenMinutesSeconds - 60);
    expect(retryAfter).toBeLessThanOrEqual(fifteenMinutesSeconds);
    expect(res.body.error).toMatchObject({
      code: 'rate_limited',
      message: 'too many sign-in attempts for this account; try again in 15 minutes',
      details: { retryAfterSeconds: retryAfter, scope: 'account' },
    });
    expect(Date.parse(res.body.error.details.retryAt)).toBeGreaterThan(Date.now());
  });

  it('keeps a locked account from blocking other accounts at the same address', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    await t.signUp('ben@lab.example');
    for (let i = 0; i < limitDefaults.signInPerAccount.max; i++) {
      await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' });
    }
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword }).expect(429);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ben@lab.example', password: testPassword }).expect(200);
  });

  it('counts failures for an email that has no account, so the lock-out does not reveal which exist', async () => {
    const t = makeTestApp();
    for (let i = 0; i < limitDefaults.signInPerAccount.max; i++) {
      await t.agent().post('/api/auth/sign-in').send({ email: 'nobody@lab.example', password: 'wrong password' }).expect(401);
    }
    await t.agent().post('/api/auth/sign-in').send({ email: 'nobody@lab.example', password: 'wrong password' }).expect(429);
  });

  it('forgets an account’s failures once it signs in', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const attempt = (password: string) => t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password });
    for (let i = 0; i < limitDefaults.signInPerAccount.max - 1; i++) await attempt('wrong password').expect(401);
    await attempt(testPassword).expect(200);
    for (let i = 0; i < limitDefaults.signInPerAccount.max - 1; i++) await attempt('wrong password').expect(401);
    await attempt(testPassword).expect(200);
  });

  it('after 20 attempts from one address answers 429 to that address only', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    // The test client is on loopback, a trusted proxy, so X-Forwarded-For names the client address.
    const from = (address: string, email: string, password: string) =>
      t.agent().post('/api/auth/sign-in').set('X-Forwarded-For', address).send({ email, password });
    for (let i = 0; i < limitDefaults.signInPerAddress.max; i++) {
      await from('203.0.113.7', `user${i}@lab.example`, 'wrong password').expect(401);
    }
    const refused = await from('203.0.113.7', 'ada@lab.example', testPassword);
    expect(refused.status).toBe(429);
    expect(refused.body.error.message).toBe('too many sign-in attempts for your address; try again in 15 minutes');
    expect(refused.body.error.details.scope).toBe('address');
    expect(Number(refused.headers['retry-after'])).toBeGreaterThan(0);
    await from('198.51.100.4', 'ada@lab.example', testPassword).expect(200);
  });

  it('keeps the counters of two apps apart', async () => {
    const locked = makeTestApp();
    const fresh = makeTestApp();
    for (let i = 0; i < limitDefaults.signInPerAccount.max; i++) {
      await locked.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' });
    }
    await locked.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' }).expect(429);
    await fresh.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' }).expect(401);
  });
});

describe('limits under concurrency', () => {
  const wrong = (t: ReturnType<typeof makeTestApp>, email: string, address: string, i: number) =>
    t.agent().post('/api/auth/sign-in').set('X-Forwarded-For', address).send({ email, password: `wrong guess ${i}` });

  it('answers 50 simultaneous wrong passwords from one address with at most the limit of 401s, the rest 429', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const statuses = (await Promise.all(Array.from({ length: 50 }, (_, i) => wrong(t, 'ada@lab.example', '203.0.113.9', i)))).map((r) => r.status);
    const unauthorized = statuses.filter((s) => s === 401).length;
    expect(unauthorized).toBeLessThanOrEqual(limitDefaults.signInPerAccount.max);
    expect(statuses.filter((s) => s !== 401).every((s) => s === 429)).toBe(true);
    expect(unauthorized + statuses.filter((s) => s === 429).length).toBe(50);
  });

  it('holds the account limit against 100 simultaneous guesses from 100 addresses', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const statuses = (await Promise.all(Array.from({ length: 100 }, (_, i) => wrong(t, 'ada@lab.example', `198.51.100.${i + 1}`, i)))).map((r) => r.status);
    expect(statuses.filter((s) => s === 401).length).toBeLessThanOrEqual(limitDefaults.signInPerAccount.max);
    expect(statuses.filter((s) => s === 429).length).toBeGreaterThanOrEqual(100 - limitDefaults.signInPerAccount.max);
  });

  it('does not count successful sign-ins: a lab behind one address signs in more often than the address limit', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    for (let i = 0; i < limitDefaults.signInPerAddress.max + 5; i++) {
      await t.agent().post('/api/auth/sign-in').set('X-Forwarded-For', '203.0.113.50').send({ email: 'ada@lab.example', password: testPassword }).expect(200);
    }
    // And the failures that follow still have their full allowance.
    await wrong(t, 'nobody@lab.example', '203.0.113.50', 0).expect(401);
  });
});

describe('sign-up limit', () => {
  it(`refuses the sign-up after ${limitDefaults.signUpPerAddress.max} an hour from one address with 429 and Retry-After, before hashing a password`, async () => {
    const t = makeTestApp();
    for (let i = 0; i < limitDefaults.signUpPerAddress.max; i++) await t.signUp(`member${i}@lab.example`);
    const res = await t.agent().post('/api/auth/sign-up').send({ email: 'one.more@lab.example', password: testPassword, name: 'One More' });
    expect(res.status).toBe(429);
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(60 * 60 - 120);
    expect(res.body.error).toMatchObject({ code: 'rate_limited', message: 'too many sign-ups for your address; try again in 60 minutes', details: { scope: 'address' } });
    // Nothing was created, and signing in to existing accounts still works.
    await t.agent().post('/api/auth/sign-in').send({ email: 'one.more@lab.example', password: testPassword }).expect(401);
    await t.agent().post('/api/auth/sign-in').send({ email: 'member0@lab.example', password: testPassword }).expect(200);
  });
});
