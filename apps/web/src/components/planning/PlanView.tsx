import type { ReactNode } from 'react';
import {
  CalendarClock,
  CircleCheck,
  FlaskConical,
  Snowflake,
  TriangleAlert,
  TrendingDown,
  TrendingUp,
} from 'lucide-react';
import type { PitchVerdict } from '@barmkeep/core';
import type { BrewPlanDto } from '@barmkeep/schemas';
import { Card, Notice, cx } from '..';
import {
  formatCells,
  formatGrams,
  formatGravityFromPlato,
  formatHours,
  formatStarterVolume,
  formatWhen,
  type Units,
} from '../../lib/planningFormat';
import { readableSource } from '../../lib/sources';

type Verdict = BrewPlanDto['verdict'];

const verdictLook: Record<PitchVerdict['kind'], { Icon: typeof CircleCheck; classes: string }> = {
  under: { Icon: TrendingDown, classes: 'border-warn-line bg-warn-soft text-warn' },
  on_target: { Icon: CircleCheck, classes: 'border-accent bg-accent-soft/60 text-accent-strong' },
  over: { Icon: TrendingUp, classes: 'border-rule-strong bg-paper-raised text-ink' },
};

function Num({ children }: { children: ReactNode }) {
  return <span className="num">{children}</span>;
}

function Fact({ label, children }: { label: ReactNode; children: ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-sm text-ink-muted">{label}</dt>
      <dd className="font-medium">{children}</dd>
    </div>
  );
}

export function VerdictPanel({ plan }: { plan: BrewPlanDto }) {
  const v: Verdict = plan.verdict;
  const { Icon, classes } = verdictLook[v.kind];
  const rangeText =
    plan.verdictLow.kind === plan.verdictHigh.kind && plan.verdictLow.kind === v.kind
      ? 'across the whole range'
      : `from “${plan.verdictLow.text.toLowerCase()}” at the low end to “${plan.verdictHigh.text.toLowerCase()}” at the high end`;
  return (
    <div className={cx('rounded-lg border-l-4 border px-4 py-3', classes)} data-testid="verdict">
      <p className="flex items-center gap-2 text-lg font-semibold">
        <Icon aria-hidden className="size-5 shrink-0" />
        {v.text}
      </p>
      <p className="mt-1 text-ink">
        Pitch about <Num>{formatCells(plan.final.cells)}</Num> viable cells (range{' '}
        <Num>{formatCells(plan.final.low)}</Num> – <Num>{formatCells(plan.final.high)}</Num>) against a target of{' '}
        <Num>{formatCells(plan.targetCells)}</Num>; {rangeText}.
      </p>
      <p className="mt-1 text-sm text-ink-muted">
        The range carries the uncertainty of the culture’s cell figure (the estimate’s spread or the count’s 95%
        interval) through every step. On target means 90–120% of the target.
      </p>
    </div>
  );
}

export function Cautions() {
  return (
    <Card className="space-y-2" aria-labelledby="cautions-title">
      <h2 id="cautions-title" className="flex items-center gap-2 text-lg font-semibold">
        <TriangleAlert aria-hidden className="size-5 text-warn" />
        Before you boil
      </h2>
      <ul className="list-disc space-y-1 pl-5 text-ink">
        <li>
          Malt-extract wort foams up and boils over quickly. Use a pan or borosilicate glass made for the heat, hold hot
          glass with a dry cloth or mitt, and let it cool before it touches cold water or a cold surface.
        </li>
        <li>
          A fermenting starter makes gas. Cover it with foil or an airlock, never a sealed lid: pressure can burst a
          closed jar or bottle.
        </li>
        <li>
          Drop a stir bar in gently (it can crack glass), keep it clean, and pull it out with a magnet before decanting
          or pitching. Keep the stir plate away from the flame and water.
        </li>
        <li>Follow the labels of your malt extract, sanitiser and equipment, and your local rules; they come first.</li>
      </ul>
    </Card>
  );
}

interface PlanViewProps {
  plan: BrewPlanDto;
  units: Units;
  /** offered when the start is too small for the smallest vessel */
  onAddVessel?: (ml: number) => void;
  /** number of steps already logged, so the ladder continues their numbering */
  stepOffset?: number;
}

export function PlanView({ plan, units, onAddVessel, stepOffset = 0 }: PlanViewProps) {
  const tz = units.timeZone;
  const s = plan.schedule;
  return (
    <div className="space-y-5">
      <VerdictPanel plan={plan} />

      <Card className="space-y-3">
        <h2 className="text-lg font-semibold">Cells</h2>
        <dl className="grid grid-cols-1 gap-3 sm:grid-cols-2">
          <Fact label="Target (viable cells)">
            <Num>{formatCells(plan.targetCells)}</Num>
            {plan.rate != null ? (
              <span className="block text-sm font-normal text-ink-muted">
                <Num>{plan.rate}</Num> million cells per mL per °P — {readableSource(plan.rateSource)}
              </span>
            ) : null}
          </Fact>
          <Fact label="Your culture now">
            <Num>{formatCells(plan.cultureNow.cells)}</Num>{' '}
            <span className="text-sm font-normal text-ink-muted">
              (<Num>{formatCells(plan.cultureNow.low)}</Num> – <Num>{formatCells(plan.cultureNow.high)}</Num>)
            </span>
          </Fact>
          {plan.cultureOnBrewDay ? (
            <Fact label="Your culture on brew day, without a starter">
              <Num>{formatCells(plan.cultureOnBrewDay.cells)}</Num>{' '}
              <span className="text-sm font-normal text-ink-muted">
                ({Math.round((plan.cultureOnBrewDay.cells / plan.targetCells) * 100)}% of the target)
              </span>
            </Fact>
          ) : null}
          <Fact label="The starter begins from">
            <Num>{formatCells(plan.startCells.cells)}</Num>{' '}
            <span className="text-sm font-normal text-ink-muted">
              (<Num>{formatCells(plan.startCells.low)}</Num> – <Num>{formatCells(plan.startCells.high)}</Num>)
            </span>
          </Fact>
        </dl>
        {plan.cultureNotes.map((n) => (
          <p key={n} className="text-sm text-warn">
            Out of the model’s range: {n}.
          </p>
        ))}
      </Card>

      {plan.noStarterNeeded ? (
        <Notice tone="success" word="No starter needed" title="the culture already holds enough cells">
          Pitch it as it is on brew day.
        </Notice>
      ) : null}

      {!plan.stepUp.feasible ? (
        <Notice tone="warning" word="Not reachable" title="this equipment cannot reach the target">
          <p>{plan.stepUp.reason}</p>
          <ul className="mt-2 list-disc space-y-1 pl-5">
            {plan.maxFirstVesselMl != null ? (
              <li>
                Start in a smaller vessel: at most <Num>{plan.maxFirstVesselMl} mL</Num> of wort for this many cells.
                {onAddVessel ? (
                  <>
                    {' '}
                    <button
                      type="button"
                      className="font-medium text-accent underline underline-offset-4"
                      onClick={() => onAddVessel(Math.max(5, Math.min(plan.maxFirstVesselMl!, 50)))}
                    >
                      Add a {Math.max(5, Math.min(plan.maxFirstVesselMl, 50))} mL vessel to this plan
                    </button>
                  </>
                ) : null}
              </li>
            ) : null}
            <li>
              Start from more yeast: the sediment of more bottles, or blend in another culture of the same strain.
            </li>
            <li>Add a larger flask, or allow a larger step between volumes in your equipment.</li>
          </ul>
        </Notice>
      ) : null}

      {!s.fitsInTime ? (
        <Notice
          tone="warning"
          word="Too little time"
          title={`the first step would have had to start ${formatHours(s.hoursShort)} ago`}
        >
          <p>
            Started now, the yeast is ready at <Num>{formatWhen(s.readyAt, tz)}</Num>.
          </p>
          <ul className="mt-2 list-disc space-y-1 pl-5">
            {plan.fitsInTimeAlternative ? (
              <li>
                A {plan.fitsInTimeAlternative.steps}-step plan fits before brew day and reaches{' '}
                <Num>{Math.round(plan.fitsInTimeAlternative.fractionOfTarget * 100)}%</Num> of the target (
                <Num>{formatCells(plan.fitsInTimeAlternative.finalCells)}</Num>).
              </li>
            ) : null}
            <li>
              Brew later, blend in another culture, or start bigger (a larger first step needs more yeast to begin
              with).
            </li>
            <li>A stir plate shortens each step to about a day.</li>
          </ul>
        </Notice>
      ) : null}

      {plan.steps.length > 0 ? (
        <section aria-labelledby="ladder-title" className="space-y-3">
          <h2 id="ladder-title" className="text-lg font-semibold">
            Step-up ladder
          </h2>
          <ol className="space-y-3" data-testid="ladder">
            {plan.steps.map((step, i) => (
              <li key={i}>
                <Card className="space-y-3 p-4 sm:p-5" data-testid="ladder-step">
                  <div className="flex flex-wrap items-baseline justify-between gap-2">
                    <h3 className="flex items-center gap-2 font-semibold">
                      <FlaskConical aria-hidden className="size-5 text-accent" />
                      Step {stepOffset + i + 1}: <Num>{formatStarterVolume(step.volumeL, units.unitSystem)}</Num> at{' '}
                      <Num>{formatGravityFromPlato(step.plato, units.gravityUnit)}</Num>
                    </h3>
                    <p className="flex items-center gap-1 text-sm text-ink-muted">
                      <CalendarClock aria-hidden className="size-4" />
                      Start <Num>{formatWhen(step.startAt, tz)}</Num>
                    </p>
                  </div>
                  <dl className="grid grid-cols-2 gap-3 sm:grid-cols-4">
                    <Fact label="Dry malt extract">
                      <Num>{formatGrams(step.dmeGrams, units.unitSystem)}</Num>
                      <span className="block text-sm font-normal text-ink-muted">
                        or <Num>{formatGrams(step.lmeGrams, units.unitSystem)}</Num> liquid extract
                      </span>
                    </Fact>
                    <Fact label="Water to dissolve it in">
                      <Num>{formatStarterVolume(step.waterMl / 1000, units.unitSystem)}</Num>
                      <span className="block text-sm font-normal text-ink-muted">then make up to the volume</span>
                    </Fact>
                    <Fact label="Viable cells at the end">
                      <Num>{formatCells(step.expectedCells)}</Num>
                      <span className="block text-sm font-normal text-ink-muted">
                        <Num>{formatCells(step.range.low)}</Num> – <Num>{formatCells(step.range.high)}</Num>
                      </span>
                    </Fact>
                    <Fact label="Duration">
                      <Num>{formatHours(step.hours)}</Num>
                      <span className="block text-sm font-normal text-ink-muted">
                        to <Num>{formatWhen(step.endAt, tz)}</Num>
                      </span>
                    </Fact>
                    <Fact label="Inoculation rate">
                      <Num>{step.inoculationRate.toFixed(2)}</Num> billion cells per g of extract
                    </Fact>
                    <Fact label="Cells pitched per mL">
                      <Num>{(step.inoculationCellsPerMl / 1e6).toFixed(1)}</Num> million
                    </Fact>
                  </dl>
                </Card>
              </li>
            ))}
          </ol>
          <p className="text-sm text-ink-muted">
            Total <Num>{formatGrams(plan.stepUp.totalDmeGrams, units.unitSystem)}</Num> dry malt extract over{' '}
            <Num>{formatHours(plan.stepUp.totalHours)}</Num>. Before each step, check the last one finished: its gravity
            should have dropped by half to three quarters.
          </p>
        </section>
      ) : null}

      {plan.steps.length > 0 || !plan.noStarterNeeded ? (
        <Card className="space-y-1">
          <p className="flex items-center gap-2 font-medium">
            <Snowflake aria-hidden className="size-5 text-accent" />
            Chill and let it settle from <Num>{formatWhen(s.coldCrashStartAt, tz)}</Num>
          </p>
          <p className="text-ink-muted">
            {s.brewAt ? (
              <>
                Decant and pitch on brew day, <Num>{formatWhen(s.brewAt, tz)}</Num>.
              </>
            ) : (
              <>
                Ready to pitch from <Num>{formatWhen(s.readyAt, tz)}</Num>.
              </>
            )}{' '}
            Times are in {tz.replaceAll('_', ' ')}.
          </p>
        </Card>
      ) : null}

      {plan.warnings.length ? (
        <ul className="space-y-1 text-sm text-ink-muted">
          {plan.warnings.map((w) => (
            <li key={w}>{w}</li>
          ))}
        </ul>
      ) : null}
    </div>
  );
}
