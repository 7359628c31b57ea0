import { rangeMessage } from './vehicle-form';
import { formLimits, inputStep, metricValue, shownValue } from './vehicle-form-units';

describe('formLimits', () => {
  it('When the units are metric, then the limits are the API ranges', () => {
    const limits = formLimits('metric', 'gasoline');
    expect(rangeMessage(limits.displacementL)).toBe('Displacement must be 0.05–20 L.');
    expect(rangeMessage(limits.injectorCcMin)).toBe('Injector flow must be 10–10000 cc/min.');
    expect(rangeMessage(limits.tireDiameterMm)).toBe('Tyre diameter must be 200–1500 mm.');
  });

  it.each([
    // 0.05–20 L = 3.05–1220.47 ci, rounded inward to 0.1 ci
    ['displacementL', 'gasoline', 'Displacement must be 3.1–1220.4 ci.'],
    // 10–10000 cc/min at 0.745 g/cc = 0.985–985.47 lb/h
    ['injectorCcMin', 'gasoline', 'Injector flow must be 1–985.4 lb/h.'],
    // E85 is denser, so the same injectors flow more lb/h
    ['injectorCcMin', 'e85', 'Injector flow must be 1.1–1034.9 lb/h.'],
    // 200–1500 mm = 7.874–59.055 in
    ['tireDiameterMm', 'gasoline', 'Tyre diameter must be 7.88–59.05 in.'],
    ['finalDrive', 'gasoline', 'Final drive must be 1–10.'],
  ] as const)('When %p is typed in imperial on %p, then the message is %p', (field, fuel, text) => {
    expect(rangeMessage(formLimits('imperial', fuel)[field])).toBe(text);
  });
});

describe('shownValue and metricValue', () => {
  it.each([
    ['displacementL', 2, 122.05],
    ['tireDiameterMm', 631.9, 24.88],
    ['injectorCcMin', 550, 54.2],
  ] as const)('When %p is %p in the API, then imperial shows %p', (field, metric, shown) => {
    expect(shownValue(field, metric, 'imperial', 'gasoline')).toBe(shown);
    expect(shownValue(field, metric, 'metric', 'gasoline')).toBe(metric);
  });

  it('When the shown value was not touched, then the original metric value is sent', () => {
    const origin = { shown: 122.05, metric: 2 };
    expect(metricValue('displacementL', 122.05, 'imperial', 'gasoline', origin)).toBe(2);
  });

  it.each([
    // 350 ci × 16.387064 cm³ = 5735.47 cm³
    ['displacementL', 350, 5.7354724],
    // 25 in × 25.4 mm
    ['tireDiameterMm', 25, 635],
    // 60 lb/h × 453.59237 g / 60 min / 0.745 g/cc
    ['injectorCcMin', 60, 608.8488],
  ] as const)('When %p is typed as %p in imperial, then %p is sent', (field, shown, metric) => {
    const origin = { shown: 1, metric: 1 };
    expect(metricValue(field, shown, 'imperial', 'gasoline', origin)).toBeCloseTo(metric, 4);
  });

  it('When metric is typed, then it is sent as typed', () => {
    expect(metricValue('displacementL', 1.6, 'metric', 'gasoline')).toBe(1.6);
  });
});

describe('inputStep', () => {
  it.each([
    ['displacementL', 'metric', 0.1],
    ['displacementL', 'imperial', 1],
    ['tireDiameterMm', 'imperial', 0.01],
  ] as const)('When %p is typed in %p, then the spinner steps by %p', (field, units, step) => {
    expect(inputStep(field, units)).toBe(step);
  });
});
