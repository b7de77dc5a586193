import { buildClientIfStale } from '../../scripts/client-build';

// The e2e tests run the production server, which serves the built client.
export default async function setup() {
  await buildClientIfStale(() => undefined);
}
