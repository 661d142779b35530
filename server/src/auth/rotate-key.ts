import { loadConfig } from '../config.js';
import { rotateKeyFile } from './token-keys.js';

/** `npm run rotate-key`: a new signing key in the key file; the previous two still verify. */
function main(): void {
  const config = loadConfig();
  if (config.tokenKeys) {
    console.error(
      'TRACELOOM_TOKEN_SECRET is set: rotate by moving it to TRACELOOM_TOKEN_SECRETS_PREVIOUS and setting a new one.',
    );
    process.exit(2);
  }
  const kid = rotateKeyFile(config.keyFile);
  console.log(`New signing key ${kid} in ${config.keyFile}; restart the server to sign with it.`);
}

try {
  main();
} catch (err) {
  console.error(
    `Traceloom could not rotate the key: ${err instanceof Error ? err.message : String(err)}`,
  );
  process.exit(1);
}
