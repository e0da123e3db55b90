import fs from 'node:fs';
import path from 'node:path';
import { test as setup } from '@playwright/test';
import { SESSION_ACCOUNTS, sessionFile, signIn } from './support';

// Each demo account signs in once through the real form; the other tests open pages with the saved session
// (support.ts useSession / openSignedIn) instead of typing the password again.
for (const email of SESSION_ACCOUNTS) {
  setup(`${email} signs in through the form`, async ({ page }) => {
    await signIn(page, email);
    fs.mkdirSync(path.dirname(sessionFile(email)), { recursive: true });
    await page.context().storageState({ path: sessionFile(email) });
  });
}
