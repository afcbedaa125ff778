// @vitest-environment happy-dom
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { redactReport, runChecks, type GradeReport } from '@shared/checks';
import { REVERSING_CONVEYOR } from '@shared/field';
import { THREE_WIRE } from '@shared/labs';
import ReportView from '@/components/labs/ReportView.vue';
import ScriptEditor from '@/components/labs/ScriptEditor.vue';
import type { DraftScript } from '@/components/labs/scriptModel';

function grade(program = THREE_WIRE.starter): GradeReport {
  const result = runChecks({ program, panel: REVERSING_CONVEYOR, script: THREE_WIRE.script });
  if (!result.ok) throw new Error(result.errors.join('; '));
  return result.report;
}

describe('the grade report component', () => {
  it('offers "show me" on failed checks only, and says when it is pressed', async () => {
    const report = grade();
    const wrapper = mount(ReportView, { props: { report, showMe: true } });
    const failed = report.checks.filter((c) => !c.passed);
    expect(wrapper.findAll('button.show-me')).toHaveLength(failed.length);
    await wrapper.find(`[data-testid="check-${failed[0]!.index}"] button.show-me`).trigger('click');
    expect(wrapper.emitted('showMe')).toEqual([[failed[0]!.index, failed[0]!.atMs]]);
  });

  it('shows a student the hidden checks as one line of counts', () => {
    const wrapper = mount(ReportView, { props: { report: redactReport(grade(THREE_WIRE.solution)) } });
    expect(wrapper.find('[data-testid="hidden-summary"]').text()).toBe('Hidden checks: 3 passed, 0 failed (4 of 4 points).');
    expect(wrapper.findAll('li.check')).toHaveLength(5);
    expect(wrapper.text()).not.toContain('overload');
    expect(wrapper.find('[data-testid="report-score"]').text()).toBe('11 / 11');
  });
});

describe('the check-script editor component', () => {
  const script: DraftScript = { panel: 'reversing-conveyor', steps: [{ press: 'S2' }, { wait: 100 }, { expect: { K1: 'closed' }, label: 'runs', points: 2 }] };

  it('adds a step of the chosen action at the end', async () => {
    const wrapper = mount(ScriptEditor, { props: { modelValue: script, panel: REVERSING_CONVEYOR } });
    await wrapper.find('select[aria-label="New step action"]').setValue('trip');
    await wrapper.findAll('button').find((b) => b.text() === 'Add step')!.trigger('click');
    expect(wrapper.emitted('update:modelValue')?.[0]?.[0]).toEqual({ ...script, steps: [...script.steps, { trip: 'F1' }] });
  });

  it('shows a step’s problem under that step and counts it', async () => {
    const bad: DraftScript = { ...script, steps: [{ press: 'K1' }, ...script.steps.slice(1)] };
    const wrapper = mount(ScriptEditor, { props: { modelValue: bad, panel: REVERSING_CONVEYOR } });
    expect(wrapper.find('[data-testid="script-validity"]').text()).toBe('1 problem');
    expect(wrapper.find('[data-testid="step-1"] .errors').text()).toMatch(/^step 1: "press" needs the id of/);
    expect(wrapper.find('[data-testid="step-2"] .errors').exists()).toBe(false);
    expect(wrapper.find('[data-testid="script-points"]').text()).toBe('2');
  });
});
