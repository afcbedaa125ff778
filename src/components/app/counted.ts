/** A count with its noun in the right number: "1 step", "3 hidden checks", "0 problems" (English plural rules). */
const rules = new Intl.PluralRules('en');

export function counted(n: number, one: string, many = `${one}s`): string {
  return `${n} ${rules.select(n) === 'one' ? one : many}`;
}
