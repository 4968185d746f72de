/** The part of the `sax` XML parser's API that ./svg-safety.ts uses (the package ships no types). */
declare module 'sax' {
	interface QualifiedAttribute {
		name: string;
		value: string;
		prefix: string;
		local: string;
		uri: string;
	}

	interface QualifiedTag {
		name: string;
		prefix: string;
		local: string;
		uri: string;
		attributes: Record<string, QualifiedAttribute>;
		isSelfClosing: boolean;
	}

	interface SAXOptions {
		xmlns?: boolean;
		position?: boolean;
		strictEntities?: boolean;
	}

	interface SAXParser {
		line: number;
		column: number;
		onerror: (error: Error) => void;
		ontext: (text: string) => void;
		oncdata: (text: string) => void;
		ondoctype: (doctype: string) => void;
		onsgmldeclaration: (declaration: string) => void;
		onprocessinginstruction: (pi: { name: string; body: string }) => void;
		onopentag: (tag: QualifiedTag) => void;
		onclosetag: (name: string) => void;
		write(chunk: string): SAXParser;
		close(): SAXParser;
	}

	const sax: {
		parser(strict: boolean, options?: SAXOptions): SAXParser;
		MAX_BUFFER_LENGTH: number;
	};
	export default sax;
	export type { QualifiedAttribute, QualifiedTag, SAXParser };
}
