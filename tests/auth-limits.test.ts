import { describe, expect, it } from 'vitest';
import { AttemptLimiter, signInLimitDefaults, signUpLimitDefault } from '../server/auth/rateLimit.js';
import { makeTestApp, testPassword } from './helpers/app.js';

const fifteenMinutesSeconds = 15 * 60;

describe('sign-in rate limits', () => {
  it('after 5 wrong passwords for one account answers 429 with Retry-After, even to the right password', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const client = t.agent();
    for (let i = 0; i < signInLimitDefaults.perAccount.max; i++) {
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
    for (let i = 0; i < signInLimitDefaults.perAccount.max; i++) {
      await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' });
    }
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword }).expect(429);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ben@lab.example', password: testPassword }).expect(200);
  });

  it('counts failures for an email that has no account, so the lock-out does not reveal which exist', async () => {
    const t = makeTestApp();
    for (let i = 0; i < signInLimitDefaults.perAccount.max; i++) {
      await t.agent().post('/api/auth/sign-in').send({ email: 'nobody@lab.example', password: 'wrong password' }).expect(401);
    }
    await t.agent().post('/api/auth/sign-in').send({ email: 'nobody@lab.example', password: 'wrong password' }).expect(429);
  });

  it('forgets an account’s failures once it signs in', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const attempt = (password: string) => t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password });
    for (let i = 0; i < signInLimitDefaults.perAccount.max - 1; i++) await attempt('wrong password').expect(401);
    await attempt(testPassword).expect(200);
    for (let i = 0; i < signInLimitDefaults.perAccount.max - 1; i++) await attempt('wrong password').expect(401);
    await attempt(testPassword).expect(200);
  });

  it('after 20 attempts from one address answers 429 to that address only', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    // The test client is on loopback, a trusted proxy, so X-Forwarded-For names the client address.
    const from = (address: string, email: string, password: string) =>
      t.agent().post('/api/auth/sign-in').set('X-Forwarded-For', address).send({ email, password });
    for (let i = 0; i < signInLimitDefaults.perAddress.max; i++) {
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
    for (let i = 0; i < signInLimitDefaults.perAccount.max; i++) {
      await locked.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' });
    }
    await locked.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' }).expect(429);
    await fresh.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'wrong password' }).expect(401);
  });
});

describe('AttemptLimiter', () => {
  it('refuses the attempt after the maximum and says how long until the window ends', () => {
    let nowMs = 1_000_000;
    const limiter = new AttemptLimiter({ max: 2, windowMs: 60_000 }, () => nowMs);
    limiter.record('k');
    nowMs += 10_000;
    expect(limiter.check('k')).toEqual({ allowed: true });
    limiter.record('k');
    expect(limiter.check('k')).toEqual({ allowed: false, retryAfterMs: 50_000 });
    expect(limiter.check('other')).toEqual({ allowed: true });
  });

  it('opens again once the window has passed', () => {
    let nowMs = 0;
    const limiter = new AttemptLimiter({ max: 1, windowMs: 60_000 }, () => nowMs);
    limiter.record('k');
    expect(limiter.check('k').allowed).toBe(false);
    nowMs = 59_999;
    expect(limiter.check('k').allowed).toBe(false);
    nowMs = 60_000;
    expect(limiter.check('k').allowed).toBe(true);
    limiter.record('k');
    expect(limiter.check('k')).toEqual({ allowed: false, retryAfterMs: 60_000 });
  });

  it(`refuses the sign-up after ${signUpLimitDefault.max} an hour from one address with 429 and Retry-After, before hashing a password`, async () => {
    const t = makeTestApp();
    for (let i = 0; i < signUpLimitDefault.max; i++) await t.signUp(`member${i}@lab.example`);
    const res = await t.agent().post('/api/auth/sign-up').send({ email: 'one.more@lab.example', password: testPassword, name: 'One More' });
    expect(res.status).toBe(429);
    expect(Number(res.headers['retry-after'])).toBeGreaterThan(60 * 60 - 120);
    expect(res.body.error).toMatchObject({ code: 'rate_limited', message: 'too many sign-ups for your address; try again in 60 minutes', details: { scope: 'address' } });
    // Nothing was created, and signing in to existing accounts still works.
    await t.agent().post('/api/auth/sign-in').send({ email: 'one.more@lab.example', password: testPassword }).expect(401);
    await t.agent().post('/api/auth/sign-in').send({ email: 'member0@lab.example', password: testPassword }).expect(200);
  });
});
