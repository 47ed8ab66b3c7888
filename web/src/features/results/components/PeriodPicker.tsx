import { useState } from 'react';
import { Button } from 'primereact/button';
import { InputText } from 'primereact/inputtext';
import type { ResultsPeriodQuery } from '@stavemark/shared';

/** From and to dates for a results page; empty means the API's default (the academic year). */
export function PeriodPicker({ value, onChange, shown }: { value: ResultsPeriodQuery; onChange: (p: ResultsPeriodQuery) => void; shown?: { from: string; to: string } }) {
  const [from, setFrom] = useState(value.from ?? '');
  const [to, setTo] = useState(value.to ?? '');
  const problem = from && to && from > to ? '“To” is before “from”.' : null;
  return (
    <form
      className="sm-period"
      aria-label="Period"
      onSubmit={(e) => {
        e.preventDefault();
        if (!problem) onChange({ ...(from ? { from } : {}), ...(to ? { to } : {}) });
      }}
    >
      <span className="sm-field">
        <label htmlFor="period-from">From</label>
        <InputText id="period-from" type="date" value={from || shown?.from || ''} onChange={(e) => setFrom(e.target.value)} />
      </span>
      <span className="sm-field">
        <label htmlFor="period-to">To</label>
        <InputText id="period-to" type="date" value={to || shown?.to || ''} onChange={(e) => setTo(e.target.value)} aria-invalid={problem ? true : undefined} />
      </span>
      <Button type="submit" label="Show" severity="secondary" />
      {problem && <span className="sm-field-error" role="alert">{problem}</span>}
    </form>
  );
}
