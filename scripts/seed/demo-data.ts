// The invented demo scenario: a firm, its staff and their demo passwords. Demo only.
export const DEMO_FIRM = {
	firmName: 'Copperleaf Water & Stone',
	timeZone: 'America/Denver',
	email: 'office@copperleaf.example',
	phone: '(555) 014-2270',
	street: '18 Millrace Lane',
	town: 'Linden Ford',
	region: 'CO',
	postalCode: '80999',
	serviceArea: 'Linden Ford, Alder Crossing, Juniper Flats, Stillwater Bend and the valley between',
	replyTargetHours: 24
};

export const DEMO_STAFF = [
	{
		name: 'Mara Quill',
		email: 'mara@copperleaf.example',
		role: 'owner',
		password: 'quill-demo-owner-2027'
	},
	{
		name: 'Teo Baptiste',
		email: 'teo@copperleaf.example',
		role: 'sales',
		password: 'baptiste-demo-sales-2027'
	},
	{
		name: 'Rosa Lindqvist',
		email: 'rosa@copperleaf.example',
		role: 'crew',
		password: 'lindqvist-demo-crew-2027'
	}
] as const;
