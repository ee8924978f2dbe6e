// The place field's combobox: looked up after typing stops, arrow keys and Enter pick, Escape
// closes, a click picks, and "no such place" is said in words.
import { beforeEach, describe, expect, it, vi } from 'vitest';
import { flushPromises, mount } from '@vue/test-utils';
import { defineComponent, h, ref } from 'vue';
import type { Place } from '@emberline/domain';
import { findPlaces } from '@/api/search';
import PlaceCombobox from '@/components/place-combobox.vue';
import { i18n } from '@/locales';

vi.mock('@/api/search', () => ({ findPlaces: vi.fn() }));

const places: Place[] = [
  { id: 1, name: 'Innsbruck', country: 'AT', lat: 47.2627, lng: 11.3945, population: 132_000 },
  { id: 2, name: 'Innichen', country: 'IT', lat: 46.7328, lng: 12.2827, population: 3_300 },
];

function mountField() {
  const picked = ref<Place | null>(null);
  const text = ref('');
  const Host = defineComponent({
    setup: () => () =>
      h('div', [
        h('label', { for: 'where' }, 'Where is your van?'),
        h(PlaceCombobox, { id: 'where', modelValue: text.value, 'onUpdate:modelValue': (v: string) => (text.value = v), onSelect: (p: Place) => (picked.value = p) }),
      ]),
  });
  const wrapper = mount(Host, { global: { plugins: [i18n] }, attachTo: document.body });
  return { wrapper, picked, text, input: wrapper.find('input#where') };
}

describe('place combobox', () => {
  beforeEach(() => {
    document.body.innerHTML = '';
    vi.mocked(findPlaces).mockReset().mockResolvedValue(places);
  });

  it('waits for typing to stop, then offers places the arrow keys move through and Enter picks', async () => {
    const { wrapper, picked, text, input } = mountField();
    await input.setValue('I');
    await input.setValue('In');
    await input.setValue('Inn');
    await vi.waitFor(() => expect(findPlaces).toHaveBeenCalledTimes(1));
    expect(findPlaces).toHaveBeenCalledWith('Inn', 6, expect.anything());
    await flushPromises();
    const options = wrapper.findAll('[role="option"]');
    expect(options.map((o) => o.text())).toEqual(['InnsbruckAustria', 'InnichenItaly']);
    expect(wrapper.find('[role="status"]').text()).toBe('2 places found. Use the arrow keys to choose one.');

    await input.trigger('keydown', { key: 'ArrowUp' });
    expect(input.attributes('aria-activedescendant')).toBe(options[1]!.attributes('id'));
    expect(options[1]!.attributes('aria-selected')).toBe('true');
    await input.trigger('keydown', { key: 'ArrowDown' });
    expect(input.attributes('aria-activedescendant')).toBe(options[0]!.attributes('id'));
    await input.trigger('keydown', { key: 'Enter' });
    expect(picked.value?.name).toBe('Innsbruck');
    expect(text.value).toBe('Innsbruck, Austria');
    expect(input.attributes('aria-expanded')).toBe('false');
  });

  it('closes with Escape, picks with a click, and says when no place matches', async () => {
    const { wrapper, picked, input } = mountField();
    await input.setValue('Inn');
    await vi.waitFor(() => expect(input.attributes('aria-expanded')).toBe('true'));
    await input.trigger('keydown', { key: 'Escape' });
    expect(input.attributes('aria-expanded')).toBe('false');
    await input.trigger('keydown', { key: 'ArrowDown' });
    expect(input.attributes('aria-expanded')).toBe('true');
    await wrapper.findAll('[role="option"]')[1]!.trigger('mousedown');
    expect(picked.value?.name).toBe('Innichen');

    vi.mocked(findPlaces).mockResolvedValue([]);
    await input.setValue('Atlantis');
    await vi.waitFor(() => expect(wrapper.find('.place-combobox__note').exists()).toBe(true));
    expect(wrapper.find('.place-combobox__note').text()).toBe('We know no place called “Atlantis”. Check the spelling or try a nearby town.');
  });
});
