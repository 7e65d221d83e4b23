import { describe, expect, it } from 'vitest';
import { TemplateError, referencedSecretNames, renderTemplate, templateRefs } from '../../../shared/journey/template';

const context = { variables: { token: 'abc', orderId: 'Q-1001' }, secrets: { API_KEY: 'k-123', PASSWORD: 'p w' } };

describe('templates', () => {
  it('renders variables and secrets, with or without spaces in the braces', () => {
    expect(renderTemplate('https://x.example/orders/{{orderId}}?key={{secret.API_KEY}}', context)).toBe('https://x.example/orders/Q-1001?key=k-123');
    expect(renderTemplate('Bearer {{ token }}', context)).toBe('Bearer abc');
    expect(renderTemplate('{"password":"{{secret.PASSWORD}}"}', context)).toBe('{"password":"p w"}');
    expect(renderTemplate('no placeholders', context)).toBe('no placeholders');
  });

  it('names an unknown variable or secret plainly', () => {
    expect(() => renderTemplate('{{basketId}}', context)).toThrow(new TemplateError('unknown variable "basketId": no earlier step captured it'));
    expect(() => renderTemplate('{{secret.NOPE}}', context)).toThrow(/unknown secret "NOPE"/);
    expect(() => renderTemplate('{{constructor}}', context)).toThrow(/unknown variable "constructor"/);
  });

  it('rejects malformed placeholders', () => {
    expect(() => templateRefs('{{ bad-name }}')).toThrow(TemplateError);
    expect(() => templateRefs('{{secret.}}')).toThrow(/not a valid placeholder/);
    expect(() => templateRefs('{{}}')).toThrow(TemplateError);
    expect(templateRefs('{{a}} {{secret.B}}')).toEqual([
      { kind: 'variable', name: 'a' },
      { kind: 'secret', name: 'B' },
    ]);
  });

  it('lists the secret names a journey references, once each and sorted', () => {
    const steps = [
      { url: 'https://x.example/?k={{secret.API_KEY}}', headers: [{ value: 'Bearer {{secret.TOKEN}}' }], body: null },
      { url: 'https://x.example/{{orderId}}', headers: [], body: '{"p":"{{secret.PASSWORD}}","k":"{{secret.API_KEY}}"}' },
    ];
    expect(referencedSecretNames(steps)).toEqual(['API_KEY', 'PASSWORD', 'TOKEN']);
  });
});
