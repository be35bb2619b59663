import { describe, expect, test } from 'vitest';
import { StripeFakeError } from '../../../fakes/stripe/errors';
import { parseFormBody } from '../../../fakes/stripe/form-body';

function parseError(encoded: string): StripeFakeError {
  try {
    parseFormBody(encoded);
  } catch (error) {
    if (error instanceof StripeFakeError) return error;
    throw error;
  }
  throw new Error(`expected ${encoded} to be refused`);
}

describe('payments fake: form bodies', () => {
  test('decodes bracket keys into nested objects and arrays, as the SDK encodes them', () => {
    const encoded = [
      'mode=payment',
      'line_items[0][price_data][currency]=eur',
      'line_items[0][price_data][unit_amount]=125000',
      'line_items[0][price_data][product_data][name]=Mirror%20pair%20R%3D500%20mm',
      'line_items[0][quantity]=2',
      'line_items[1][price]=price_1',
      'metadata[order_ids]=ord_1%2Cord_2',
      'expand[0]=payment_intent',
      'expand[1]=line_items',
    ].join('&');
    expect(parseFormBody(encoded)).toEqual({
      mode: 'payment',
      line_items: [
        {
          price_data: { currency: 'eur', unit_amount: '125000', product_data: { name: 'Mirror pair R=500 mm' } },
          quantity: '2',
        },
        { price: 'price_1' },
      ],
      metadata: { order_ids: 'ord_1,ord_2' },
      expand: ['payment_intent', 'line_items'],
    });
  });

  test('takes encoded brackets, empty-bracket appends and an empty value (which unsets a field)', () => {
    expect(parseFormBody('expand%5B%5D=a&expand[]=b&description=')).toEqual({ expand: ['a', 'b'], description: '' });
  });

  test('makes arrays dense in index order', () => {
    expect(parseFormBody('items[2]=c&items[0]=a')).toEqual({ items: ['a', 'c'] });
  });

  test('keeps a key named __proto__ as data', () => {
    const parsed = parseFormBody('metadata[__proto__][polluted]=yes');
    expect(Object.getPrototypeOf(parsed.metadata)).toBe(Object.prototype);
    expect(({} as Record<string, unknown>).polluted).toBeUndefined();
    expect(Object.keys(parsed.metadata ?? {})).toEqual(['__proto__']);
  });

  test('refuses a key given both as a value and as a hash, naming the parameter', () => {
    const error = parseError('metadata=x&metadata[a]=b');
    expect(error.status).toBe(400);
    expect(error.body).toMatchObject({ type: 'invalid_request_error', message: 'Invalid hash', param: 'metadata' });
    expect(parseError('line_items[0][price]=p&line_items[0]=x').body.param).toBe('line_items[0]');
    expect(parseError('items[0]=a&items[x]=b').body.param).toBe('items');
  });

  test('refuses a malformed key', () => {
    expect(parseError('a]b=1').body).toMatchObject({ code: 'parameter_unknown', param: 'a]b' });
  });
});
