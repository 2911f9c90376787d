import { DEMO_DOI_RECORDS } from '$seed/demoDois';
import { config } from '../config';
import { lookupDoi, type DoiLookup } from './doiClient';
import { FakeDoiService } from './fakeDoiService';

/*
 * The app's DOI look-up: the service at DOI_SERVICE_URL, or in demo mode (when unset) a loopback
 * fake that knows the demo DOIs. Outside demo mode it defaults to https://doi.org.
 */
let fake: FakeDoiService | null = null;

async function serviceUrl(): Promise<string> {
	if (config.DOI_SERVICE_URL) return config.DOI_SERVICE_URL;
	if (!config.HOPLINE_DEMO) return 'https://doi.org';
	if (!fake) {
		const service = new FakeDoiService(DEMO_DOI_RECORDS);
		await service.listen(config.FAKE_DOI_PORT);
		process.once('sveltekit:shutdown', () => void service.close());
		fake = service;
	}
	return fake.baseUrl;
}

export async function lookUpDoi(doi: string): Promise<DoiLookup> {
	return lookupDoi(doi, { baseUrl: await serviceUrl(), timeoutMs: config.DOI_TIMEOUT_MS });
}
