// The demo service `npm start` runs: the invented tea shop, reporting its own metrics over OTLP
// to Parallax when PARALLAX_DEMO_OTLP_URL and PARALLAX_DEMO_INGEST_TOKEN are given.
import { startDemoMetrics } from './demo-metrics';
import { startDemoTarget } from './demo-target';

async function main() {
  const port = Number(process.env.DEMO_TARGET_PORT ?? 8090);
  const endpoint = process.env.PARALLAX_DEMO_OTLP_URL;
  const token = process.env.PARALLAX_DEMO_INGEST_TOKEN;
  const metrics = endpoint && token ? startDemoMetrics({ endpoint, token, intervalMs: 15_000 }) : null;
  const target = await startDemoTarget({ port, onRequest: metrics?.onRequest });
  console.log(`[demo] Quillmoor Tea Company (invented) on ${target.url}; failures switch at ${target.controlUrl}`);
  if (metrics) console.log(`[demo] its metrics go to ${endpoint} every 15 s`);
  const stop = async () => {
    await target.close();
    await metrics?.close().catch(() => {});
    process.exit(0);
  };
  process.once('SIGINT', () => void stop());
  process.once('SIGTERM', () => void stop());
}

main().catch((e) => {
  console.error(`[demo] could not start: ${(e as Error).message}`);
  process.exit(1);
});
