import { useCallback } from 'react';
import { useNavigate, useParams, type LoaderFunctionArgs } from 'react-router-dom';
import { useQuery, useQueryClient, useSuspenseQuery, type QueryClient } from '@tanstack/react-query';
import { bladeRunListQuerySchema } from '@kerfline/domain/blade-runs/schema';
import type { MaterialGroup } from '@kerfline/domain/band-speed/schema';
import { sawBreakInPlanQuery, sawDetailQuery } from '../../../features/saws/api/queries';
import { siteDetailQuery } from '../../../features/sites/api/queries';
import { bladeSpecListQuery, parseBladeSpecListQuery } from '../../../features/blade-specs/api/queries';
import { siteStockQuery } from '../../../features/blade-stock/api/queries';
import { bladeRunListQuery } from '../../../features/blade-runs/api/queries';
import { useInstallBladeRun } from '../../../features/blade-runs/api/mutations';
import { BladeOnForm } from '../../../features/blade-runs/components/blade-on-form';
import { BreakInPlanPanel } from '../../../features/blade-runs/components/break-in-plan-panel';
import { parseListQuery } from '../../../lib/list-search';
import { LinkButton } from '../../../lib/ui/button';
import { Notice } from '../../../lib/ui/notice';
import { refreshAfterSawRecord, type ReturnNotice } from '../records/refresh';
import { SawFormFrame } from './saw-form-frame';

const specsFor = (siteId: string) => bladeSpecListQuery(parseBladeSpecListQuery({ siteId }));
const recentRunsOf = (sawId: string) =>
  bladeRunListQuery(parseListQuery(bladeRunListQuerySchema, { sawId, limit: 10 }));

export function bladeOnPageLoader(queryClient: QueryClient) {
  return async ({ params }: LoaderFunctionArgs) => {
    const saw = await queryClient.ensureQueryData(sawDetailQuery(params.sawId ?? ''));
    await Promise.all([
      queryClient.ensureQueryData(siteDetailQuery(saw.siteId)),
      queryClient.ensureQueryData(specsFor(saw.siteId)),
      queryClient.ensureQueryData(recentRunsOf(saw.id)),
      // Stock only adds "n in stock" to the choices: the form works without it.
      queryClient.ensureQueryData(siteStockQuery(saw.siteId)).catch(() => undefined),
    ]);
    return null;
  };
}

/** The break-in plan for the chosen spec and material, fetched as the choice changes. */
function BreakInSlot({
  sawId,
  bladeSpecId,
  materialGroup,
  specName,
  system,
  timeZone,
}: {
  sawId: string;
  bladeSpecId: string;
  materialGroup: MaterialGroup | null;
  specName: string;
  system: 'metric' | 'imperial';
  timeZone: string;
}) {
  const plan = useQuery({
    ...sawBreakInPlanQuery(sawId, { bladeSpecId, ...(materialGroup ? { materialGroup } : {}) }),
    placeholderData: (previous) => previous,
  });
  if (plan.isPending)
    return (
      <p role="status" className="text-sm text-ink-muted">
        Working out the break-in plan…
      </p>
    );
  if (plan.isError) return <Notice title="The break-in plan could not be worked out">{plan.error.message}</Notice>;
  return <BreakInPlanPanel advice={plan.data} specName={specName} system={system} timeZone={timeZone} />;
}

/** Putting a blade on a saw: `/saws/:sawId/blade-on`. */
export function BladeOnPage() {
  const sawId = useParams().sawId ?? '';
  const navigate = useNavigate();
  const queryClient = useQueryClient();
  const { data: saw } = useSuspenseQuery(sawDetailQuery(sawId));
  const { data: site } = useSuspenseQuery(siteDetailQuery(saw.siteId));
  const { data: specs } = useSuspenseQuery(specsFor(saw.siteId));
  const { data: recent } = useSuspenseQuery(recentRunsOf(saw.id));
  const stock = useQuery(siteStockQuery(saw.siteId));
  const install = useInstallBladeRun();
  const offered = specs.items.filter((spec) => !spec.archived);

  const renderBreakIn = useCallback(
    (bladeSpecId: string, materialGroup: MaterialGroup | null) => (
      <BreakInSlot
        sawId={saw.id}
        bladeSpecId={bladeSpecId}
        materialGroup={materialGroup}
        specName={offered.find((s) => s.id === bladeSpecId)?.name ?? 'this blade'}
        system={site.unitSystem}
        timeZone={site.timeZone}
      />
    ),
    [saw.id, offered, site.unitSystem, site.timeZone],
  );

  return (
    <SawFormFrame saw={saw} site={site} title="Put a blade on">
      {saw.bladeOn ? (
        <Notice tone="caution" title="A blade is recorded on this saw">
          {saw.bladeOn.bladeSpecName} is still on it. Take it off first, then put the new one on.
          <div className="mt-2">
            <LinkButton to={`/saws/${saw.id}/blade-off?next=on`} variant="primary">
              Take it off
            </LinkButton>
          </div>
        </Notice>
      ) : null}
      {offered.length === 0 ? (
        <Notice tone="caution" title="No blade specs to choose from">
          This site has no blade specs in its catalogue yet. An administrator or the site admin adds them.
        </Notice>
      ) : (
        <BladeOnForm
          saw={saw}
          system={site.unitSystem}
          timeZone={site.timeZone}
          specs={offered}
          stock={stock.data?.items}
          recentRuns={recent.items}
          renderBreakIn={renderBreakIn}
          onSubmit={async (input) => {
            const result = await install.mutateAsync(input);
            await refreshAfterSawRecord(queryClient, saw);
            const notice: ReturnNotice = {
              tone: result.warnings.length > 0 ? 'caution' : 'info',
              title: `${result.run.bladeSpecName} is on ${saw.assetTag}.`,
              lines: result.warnings.map((w) => w.message),
            };
            await navigate(`/saws/${saw.id}`, { state: { notice } });
          }}
          cancel={<LinkButton to={`/saws/${saw.id}`}>Cancel</LinkButton>}
        />
      )}
    </SawFormFrame>
  );
}
