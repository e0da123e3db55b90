import { Input } from './input';

/** The text filter above a table; its label stays visible. */
export function SearchInput({ id, label, value, onChange, placeholder }: { id: string; label: string; value: string; onChange: (value: string) => void; placeholder?: string }) {
  return (
    <div className="flex min-w-0 flex-1 flex-col gap-1.5 sm:max-w-xs">
      <label htmlFor={id} className="text-sm font-medium text-ink-800">
        {label}
      </label>
      <Input id={id} type="search" value={value} placeholder={placeholder} onChange={(event) => onChange(event.target.value)} />
    </div>
  );
}
