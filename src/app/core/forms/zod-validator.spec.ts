import { FormControl } from '@angular/forms';
import { registerSchema } from '../../../../shared/schema/api';
import { controlMessage, sentence, zodValidator } from './zod-validator';

describe('zodValidator', () => {
  it('should accept a value the schema accepts', () => {
    const control = new FormControl('ada@example.org', zodValidator(registerSchema.shape.email));
    expect(control.valid).toBe(true);
  });

  it("should report the schema's own message as a sentence", () => {
    const control = new FormControl('short', zodValidator(registerSchema.shape.password));
    expect(controlMessage(control)).toBe('A password needs at least 10 characters.');
  });

  it('should reject an e-mail address without a domain', () => {
    const control = new FormControl('ada@', zodValidator(registerSchema.shape.email));
    expect(controlMessage(control)).toBe('Enter a valid e-mail address.');
  });
});

describe('sentence', () => {
  it('should keep existing end punctuation', () => {
    expect(sentence('done!')).toBe('Done!');
  });
});
