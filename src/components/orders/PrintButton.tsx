export default function PrintButton() {
  return (
    <button type="button" className="btn btn-quiet print:hidden" onClick={() => window.print()}>
      Print receipt
    </button>
  );
}
