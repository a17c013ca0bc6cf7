import { ComponentHarness } from '@angular/cdk/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatInputHarness } from '@angular/material/input/testing';

/**
 * The part shared by the harnesses of field groups whose inputs carry a `data-field` name: each field is
 * reached by that name, through the Material harnesses of its input and its form field.
 */
export abstract class DataFieldsHarness<Field extends string> extends ComponentHarness {
  async hasField(field: Field): Promise<boolean> {
    return (await this.locatorForOptional(inputNamed(field))()) !== null;
  }

  async getValue(field: Field): Promise<string> {
    return (await this.getInput(field)).getValue();
  }

  /** Types the text as the modeller would, key by key, after clearing the field. */
  async setValue(field: Field, text: string): Promise<void> {
    await (await this.getInput(field)).setValue(text);
  }

  /** The plain-words message, or the help, under the field. */
  async getHint(field: Field): Promise<string> {
    return (await (await this.getFormField(field)).getTextHints()).join(' ');
  }

  /** The unit shown after the field. */
  async getSuffix(field: Field): Promise<string> {
    return (await this.getFormField(field)).getSuffixText();
  }

  async getInput(field: Field): Promise<MatInputHarness> {
    return this.locatorFor(inputNamed(field))();
  }

  async getFormField(field: Field): Promise<MatFormFieldHarness> {
    return this.locatorFor(MatFormFieldHarness.with({ selector: `:has([data-field="${field}"])` }))();
  }
}

function inputNamed(field: string) {
  return MatInputHarness.with({ selector: `[data-field="${field}"]` });
}
