import type { Invoice } from '../../../../shared/schemas/billing.schema.ts';
import { formatDate, formatMoney } from './format.ts';

export function InvoiceTable({ invoices }: { invoices: Invoice[] }) {
  if (!invoices.length) return <p className="text-sm text-ink-soft">No invoices yet.</p>;
  return (
    <table className="w-full rounded-lg border border-line bg-white text-left text-sm">
      <thead className="bg-tide-50 text-ink-soft">
        <tr>
          <th scope="col" className="px-3 py-2">Invoice</th>
          <th scope="col" className="px-3 py-2">Date</th>
          <th scope="col" className="px-3 py-2">Period</th>
          <th scope="col" className="px-3 py-2">Amount</th>
          <th scope="col" className="px-3 py-2">Status</th>
        </tr>
      </thead>
      <tbody>
        {invoices.map((invoice) => (
          <tr key={invoice.id} className="border-t border-line">
            <td className="px-3 py-2">{invoice.url ? <a className="text-tide-700 underline" href={invoice.url}>{invoice.number ?? invoice.id}</a> : (invoice.number ?? invoice.id)}</td>
            <td className="px-3 py-2">{formatDate(invoice.createdAt)}</td>
            <td className="px-3 py-2">{formatDate(invoice.periodStart)} – {formatDate(invoice.periodEnd)}</td>
            <td className="px-3 py-2">{formatMoney(invoice.amount, invoice.currency)}</td>
            <td className="px-3 py-2">{invoice.status}</td>
          </tr>
        ))}
      </tbody>
    </table>
  );
}
