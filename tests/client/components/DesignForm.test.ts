// The "Signals and limits" group of the design form: each field with its unit and the documented
// default as placeholder, the stable prefix, arithmetic and structure; edits go out as texts that
// read back into the design without losing the sections the form does not show.
import { describe, expect, it } from 'vitest';
import { mount } from '@vue/test-utils';
import { Quasar } from 'quasar';
import DesignForm from '../../../src/components/DesignForm.vue';
import { designToTexts, readDesignTexts, type DesignTexts } from '../../../src/composables/designFields';
import { newDesignTemplate } from '../../../src/stores/designs';

const global = { plugins: [Quasar] };

function mountForm(texts: DesignTexts) {
  return mount(DesignForm, { props: { modelValue: texts, errors: {}, designed: {} }, global });
}

describe('DesignForm: signals and limits', () => {
  it('shows every field with its unit and the documented default as placeholder', () => {
    const wrapper = mountForm(designToTexts(newDesignTemplate('Bay 8 rig')));
    const group = wrapper.get('section[aria-labelledby="group-signals"]');
    expect(group.text()).toContain('Signals and limits');
    const input = (path: string) => group.get(`[data-path="${path}"] input, input[data-path="${path}"]`);
    // Ibase = sqrt(2) 3300 / 120 = 38.89 A: sense full scale 2 x, current limit 1.2 x (hand arithmetic)
    expect(input('signals.currentSenseFullScaleA').attributes('placeholder')).toBe('77.78');
    expect(input('limits.currentReferencePeakA').attributes('placeholder')).toBe('46.67');
    expect(input('signals.pwmCarrierCounts').attributes('placeholder')).toBe('2500');
    expect(input('limits.modulationIndexMax').attributes('placeholder')).toBe('0.95');
    expect(group.text()).toContain('Blank: documented default = 77.78');
    for (const unit of ['A', 'V', 'bits', 'counts', 'Hz']) expect(group.text()).toContain(unit);
    expect(group.find('[data-test="arithmetic"]').exists()).toBe(true);
    expect(group.find('[data-test="structure"]').exists()).toBe(true);
    expect(input('firmware.symbolPrefix').element.getAttribute('value') ?? '').toBe('');
  });

  it('emits typed limits, the prefix and the arithmetic as texts that read back into the design', async () => {
    const design = { ...newDesignTemplate('Bay 9 rig'), envelope: { shortCircuitRatioMin: 4 } };
    const wrapper = mountForm(designToTexts(design));
    const group = wrapper.get('section[aria-labelledby="group-signals"]');
    const input = (path: string) => group.get(`[data-path="${path}"] input, input[data-path="${path}"]`);
    await input('limits.currentReferencePeakA').setValue('42');
    let texts = wrapper.emitted('update:modelValue')!.at(-1)![0] as DesignTexts;
    await wrapper.setProps({ modelValue: texts });
    await input('firmware.symbolPrefix').setValue('BAY9');
    texts = wrapper.emitted('update:modelValue')!.at(-1)![0] as DesignTexts;
    await wrapper.setProps({ modelValue: texts });
    const float = group.findAll('[data-test="arithmetic"] button').find((b) => b.text() === 'float32')!;
    await float.trigger('click');
    texts = wrapper.emitted('update:modelValue')!.at(-1)![0] as DesignTexts;
    const back = readDesignTexts(texts).candidate as unknown as typeof design;
    expect(back.limits).toEqual({ currentReferencePeakA: 42 });
    expect(back.firmware).toEqual({ symbolPrefix: 'BAY9' });
    expect(back.fixedPoint).toEqual({ wordBits: 32, arithmetic: 'float32' });
    expect(back.envelope).toEqual({ shortCircuitRatioMin: 4 });
  });
});
