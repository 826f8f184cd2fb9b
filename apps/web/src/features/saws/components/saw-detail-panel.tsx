import type { ReactNode } from 'react';
import type { Saw } from '@kerfline/domain/saws/schema';
import type { UnitSystem } from '@kerfline/domain/sites/schema';
import {
  formatDate,
  formatDateTime,
  formatForce,
  formatLength,
  formatSmallLength,
  formatSpeed,
} from '../../../lib/format';
import { Card } from '../../../lib/ui/card';
import { HEAD_FEED_LABELS, SAW_KIND_LABELS } from './saws-table';

function Fact({ label, children }: { label: string; children: ReactNode }) {
  return (
    <div className="border-t border-rule py-3 first:border-t-0 sm:grid sm:grid-cols-[12rem_1fr] sm:gap-4">
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="tabular mt-0.5 text-lg font-semibold text-ink sm:mt-0">{children}</dd>
    </div>
  );
}

function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <Card aria-label={title} className="px-4 py-3 sm:px-5">
      <h2 className="pb-1 text-sm font-bold tracking-wider text-ink-muted uppercase">{title}</h2>
      <dl>{children}</dl>
    </Card>
  );
}

const siteSetting = <span className="text-base font-normal text-ink-muted">The site’s setting</span>;

/**
 * A gravity- or spring-fed head's spring-balance limits: this saw's own where set (who set them, when), else the
 * site's setting. A hydraulic head has none.
 */
function HeadForceFacts({ saw, unitSystem, timeZone }: { saw: Saw; unitSystem: UnitSystem; timeZone: string }) {
  if (saw.headFeed !== 'gravity_spring') return null;
  const own = saw.minHeadForceN !== null || saw.maxHeadForceN !== null;
  return (
    <>
      <Fact label="Largest head force">
        {saw.maxHeadForceN !== null ? formatForce(saw.maxHeadForceN, unitSystem) : siteSetting}
      </Fact>
      <Fact label="Least head force">
        {saw.minHeadForceN !== null ? formatForce(saw.minHeadForceN, unitSystem) : siteSetting}
      </Fact>
      {own ? (
        <p className="pb-3 text-sm text-ink-muted">
          {saw.headForceSet
            ? `This saw’s limit, set by ${saw.headForceSet.byName ?? 'someone no longer listed'} on ${formatDate(saw.headForceSet.at, timeZone)}.`
            : 'This saw’s limit.'}{' '}
          Read on a spring balance over the last inch of head travel.
        </p>
      ) : null}
    </>
  );
}

const notRecorded = <span className="text-base font-normal text-ink-muted">Not recorded</span>;

/** Everything recorded about one saw, in its site's units and time zone (named, as viewers may be elsewhere). */
export function SawDetailPanel({ saw, unitSystem, timeZone }: { saw: Saw; unitSystem: UnitSystem; timeZone: string }) {
  const rect =
    saw.capacityRectWidthMm !== null && saw.capacityRectHeightMm !== null
      ? `${formatLength(saw.capacityRectWidthMm, unitSystem)} × ${formatLength(saw.capacityRectHeightMm, unitSystem)}`
      : null;
  return (
    <div className="grid gap-4 lg:grid-cols-2">
      <Section title="Machine">
        <Fact label="Kind">{SAW_KIND_LABELS[saw.kind]}</Fact>
        <Fact label="Head feed">{HEAD_FEED_LABELS[saw.headFeed]}</Fact>
        <HeadForceFacts saw={saw} unitSystem={unitSystem} timeZone={timeZone} />
        <Fact label="Make">{saw.make ?? notRecorded}</Fact>
        <Fact label="Model">{saw.model ?? notRecorded}</Fact>
        <Fact label="Wheel diameter">{formatLength(saw.wheelDiameterMm, unitSystem)}</Fact>
        <Fact label="Wheel centre distance">{formatLength(saw.centreDistanceMm, unitSystem)}</Fact>
      </Section>
      <Section title="Band it takes">
        <Fact label="Band width">{formatLength(saw.bandWidthMm, unitSystem)}</Fact>
        <Fact label="Band thickness">{formatSmallLength(saw.bandThicknessMm, unitSystem)}</Fact>
        <Fact label="Band length">{formatLength(saw.bandLengthMm, unitSystem)}</Fact>
        <Fact label="Band speed">
          {formatSpeed(saw.bandSpeedMinMPerMin, unitSystem)} to {formatSpeed(saw.bandSpeedMaxMPerMin, unitSystem)}
        </Fact>
      </Section>
      <Section title="Capacity">
        <Fact label="Round stock, up to">
          {saw.capacityRoundMm !== null ? formatLength(saw.capacityRoundMm, unitSystem) : notRecorded}
        </Fact>
        <Fact label="Rectangle, width × height">{rect ?? notRecorded}</Fact>
      </Section>
      <Section title="Record">
        <Fact label="Added">{formatDateTime(saw.createdAt, timeZone, true)}</Fact>
        <Fact label="Last changed">{formatDateTime(saw.updatedAt, timeZone, true)}</Fact>
        {saw.retiredAt ? <Fact label="Retired">{formatDateTime(saw.retiredAt, timeZone, true)}</Fact> : null}
      </Section>
    </div>
  );
}
