/** One line of a channel's budget. */
export interface ChannelBudgetLine {
  /** Short name (`'noise'`, `'gauge factor'`, `'lead resistance'`...). */
  readonly name: string;
  /** What kind of effect it is. */
  readonly kind:
    | 'noise'
    | 'resolution'
    | 'nonlinearity'
    | 'leads'
    | 'temperature'
    | 'tolerance'
    | 'self-heating'
    | 'calibration';
  /** The model behind the line, in words and equations. */
  readonly model: string;
  /** The inputs of that model, with their units in the names. */
  readonly inputs: Readonly<Record<string, number | string>>;
  /** The size of the effect at the budget point, in the channel's unit (signed where a sign means something). */
  readonly value: number;
  /** Its contribution to the combined standard uncertainty, in the channel's unit; `undefined` for informative lines. */
  readonly standardUncertainty: number | undefined;
}
