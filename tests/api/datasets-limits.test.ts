import { describe, expect, it } from 'vitest';
import { DEMO, startTestApp } from '../support/app.js';

// A separate file: passport's strategy registry is process-wide, so a second app in the same file
// would take over the first app's sign-in checks.
const auth = (token: string) => ({ authorization: `Bearer ${token}` });

describe('row limit', () => {
  it('refuses more rows than UPLOAD_MAX_ROWS with 413', async () => {
    const small = await startTestApp({ UPLOAD_MAX_ROWS: '10', UPLOAD_MAX_BYTES: '2000' });
    try {
      const token = await small.login(DEMO.researcher);
      const rows = ['x'];
      for (let i = 0; i < 11; i++) rows.push(String(i));
      const res = await small.http
        .post('/api/datasets')
        .set(auth(token))
        .attach('file', Buffer.from(rows.join('\n')), 'x.csv');
      expect(res.status).toBe(413);
      expect(res.body.message).toMatch(/10 data rows/);
      // Past multer's own limit (the body is under the early Content-Length cut-off).
      const big = await small.http
        .post('/api/datasets')
        .set(auth(token))
        .attach('file', Buffer.alloc(5000, 'x\n'), 'x.csv');
      expect(big.status).toBe(413);
      expect(big.body.message).toMatch(/2000 bytes/);
    } finally {
      await small.close();
    }
  });
});
