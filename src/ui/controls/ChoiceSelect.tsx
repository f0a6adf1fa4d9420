/** A labelled drop-down over a fixed list of choices (the list filter and order, the team view's filter). */
export interface Choice<T extends string> {
  id: T;
  label: string;
}

export function ChoiceSelect<T extends string>(props: {
  label: string;
  ariaLabel: string;
  choices: readonly Choice<T>[];
  value: T;
  onChange: (value: T) => void;
}) {
  return (
    <label>
      {props.label}{' '}
      <select value={props.value} onChange={(e) => props.onChange(e.target.value as T)} aria-label={props.ariaLabel}>
        {props.choices.map((c) => (
          <option key={c.id} value={c.id}>
            {c.label}
          </option>
        ))}
      </select>
    </label>
  );
}
