/** The header row of a plain data table: one column header per name, in the table's cell padding. */
export function TableHead({ columns }: { columns: string[] }) {
  return (
    <thead>
      <tr className="border-b border-stone-300">
        {columns.map((h) => (
          <th key={h} scope="col" className="px-2 py-1">
            {h}
          </th>
        ))}
      </tr>
    </thead>
  );
}
