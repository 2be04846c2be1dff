// How the payment methods and kinds read on pages.
export const METHOD_LABELS: Record<string, string> = {
	card: 'Card',
	cheque: 'Cheque',
	cash: 'Cash',
	bank_transfer: 'Bank transfer'
};

export const KIND_LABELS: Record<string, string> = {
	deposit: 'Deposit',
	progress: 'Progress payment',
	final: 'Final payment',
	refund: 'Refund'
};
