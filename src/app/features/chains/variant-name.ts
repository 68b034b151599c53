import type { NameDialogData } from '../../core/dialogs/name-dialog.component';

/** The question for a variant's name, first offered as the parent's name marked "(variant)". */
export function variantNameQuestion(parentName: string): NameDialogData {
  return {
    title: 'Save as a variant',
    label: 'Name of the variant',
    initial: `${parentName} (variant)`.slice(0, 200),
    maxLength: 200,
    submitLabel: 'Save variant',
  };
}
