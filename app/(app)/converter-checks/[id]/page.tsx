import type { Metadata } from 'next';
import { CheckResult } from '@/components/converter/CheckResult';
import { SwrProvider } from '@/components/SwrProvider';
import { requireActor } from '@/lib/auth/guard.server';
import { can } from '@/lib/auth/policy';
import { getConverterCheck } from '@/lib/converterChecks/service.server';
import { loadPage } from '@/lib/http/pages.server';
import { idParam } from '@/lib/http/route.server';
import { converterCheckKey } from '@/lib/http/swrKeys';

export const metadata: Metadata = { title: 'Converter check' };

export default async function ConverterCheckPage({ params }: { params: Promise<{ id: string }> }) {
  const { check, manages } = await loadPage(async () => {
    const actor = await requireActor('converter:check');
    return { check: await getConverterCheck(actor, await idParam(params, 'converter_check')), manages: can(actor.role, 'recorder:manage') };
  });
  return (
    <SwrProvider fallback={{ [converterCheckKey(check.id)]: check }}>
      <CheckResult checkId={check.id} manages={manages} />
    </SwrProvider>
  );
}
