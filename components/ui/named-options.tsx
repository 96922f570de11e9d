/** The options of a picker over named things, led by the "all of them" choice (value ""). */
export function NamedOptions({ all, items }: { all: string; items: { id: string; name: string }[] }) {
  return (
    <>
      <option value="">{all}</option>
      {items.map((item) => (
        <option key={item.id} value={item.id}>
          {item.name}
        </option>
      ))}
    </>
  );
}
