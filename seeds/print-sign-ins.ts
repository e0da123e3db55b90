import { DEMO_PASSWORD, DEMO_SIGN_INS } from './demo/people';

const origin = process.env.APP_ORIGIN ?? `http://localhost:${process.env.PORT ?? 8080}`;
const width = Math.max(...DEMO_SIGN_INS.map(([who]) => who.length));
console.log(`\nRevloop is running at ${origin}\n`);
console.log(`Demo sign-ins (password for all: ${DEMO_PASSWORD}):`);
for (const [who, email] of DEMO_SIGN_INS) console.log(`  ${who.padEnd(width)}  ${email}`);
console.log(`\nMail sent by the app lands in the local mailbox: ${origin}/dev/mailbox`);
console.log('Press Ctrl+C to stop.\n');
