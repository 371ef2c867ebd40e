/** A count with its noun: `plural(1, 'lift')` is "1 lift", `plural(3, 'lift')` "3 lifts". */
export function plural(n: number, one: string, many = `${one}s`): string {
  return `${n} ${n === 1 ? one : many}`
}
