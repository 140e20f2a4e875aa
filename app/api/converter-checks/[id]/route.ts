import { requireActor } from '@/lib/auth/guard.server';
import { getConverterCheck } from '@/lib/converterChecks/service.server';
import { idParam, json, route } from '@/lib/http/route.server';

type Context = { params: Promise<{ id: string }> };

export const GET = route<Context>(async (_request, { params }) => {
  const actor = await requireActor('converter:check');
  return json(await getConverterCheck(actor, await idParam(params, 'converter_check')));
});
