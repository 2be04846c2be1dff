// Minimal typings for convert-units 2.x, used only by the tests as an outside cross-check.
declare module 'convert-units' {
	interface Converter {
		from(unit: string): { to(unit: string): number };
	}
	export default function convert(value: number): Converter;
}
