import { formatUsd, PRICE_BOOK_UNIT_LABELS, type ProposalOption } from '@loambook/common';

/** One saved option's lines, as quoted: for versions that can no longer change. */
export function OptionLinesTable({ option }: { option: ProposalOption }) {
  return (
    <div className="lines-table-wrap">
      <table className="lines-table">
        <caption className="visually-hidden">Lines of {option.title}</caption>
        <thead>
          <tr>
            <th scope="col">Item</th>
            <th scope="col" className="numeric">
              Quantity
            </th>
            <th scope="col" className="numeric">
              Unit price
            </th>
            <th scope="col" className="numeric">
              Line total
            </th>
          </tr>
        </thead>
        <tbody>
          {[...option.lines]
            .sort((a, b) => a.position - b.position)
            .map((l) => (
              <tr key={l.id}>
                <td>
                  <span className="item-code">{l.code}</span> {l.description}
                  {l.quantitySource !== 'typed' ? (
                    <span className="lines-table__source">
                      {l.quantitySource === 'injection-plan'
                        ? 'From the injection plan'
                        : 'From the pier plan'}
                    </span>
                  ) : null}
                </td>
                <td className="numeric">
                  {l.quantity} {PRICE_BOOK_UNIT_LABELS[l.unit] ?? l.unit}
                </td>
                <td className="numeric">{formatUsd(l.unitPrice)}</td>
                <td className="numeric">{formatUsd(l.lineList)}</td>
              </tr>
            ))}
        </tbody>
      </table>
      {option.discount.kind !== 'none' ? (
        <p className="lines-table__discount">
          Discount:{' '}
          {option.discount.kind === 'percent'
            ? `${option.discount.value}% of list`
            : `${formatUsd(option.discount.value)} off list`}
        </p>
      ) : null}
    </div>
  );
}
