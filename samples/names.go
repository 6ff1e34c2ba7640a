package samples

// Word lists for the invented institution. Everything here is made up for
// the demo: the institution, its buildings, its departments' codes and the
// course titles. People's names are drawn from first- and family-name lists
// written for this file and combined at random, so no list entry is a person.

// Institution is the invented institution every generated term belongs to.
const Institution = "Quillmere Polytechnic"

// emailDomain is a reserved example domain (RFC 2606), so no generated
// address can reach anyone.
const emailDomain = "quillmere.example"

// buildingNames are invented building names; codes are their first three
// letters (upper case), with a digit appended when the list is reused.
var buildingNames = []string{
	"Alder Court", "Beacon Hall", "Cobalt Building", "Driftwood House", "Elmstead Wing",
	"Foundry Block", "Granary", "Heron Building", "Ironside Hall", "Juniper House",
	"Kestrel Centre", "Larchfield Building", "Millrace Hall", "Nettlebed House", "Orchard Wing",
	"Pinfold Building", "Quarrygate Hall", "Rookery", "Saltmarsh Building", "Tannery Court",
	"Upland House", "Vinegar Yard", "Wherry Building", "Yewtree Hall", "Zephyr House",
	"Bellfounders' Hall",
}

// subject is a department: its name, a three-letter code (used in section
// and cohort IDs), whether its courses use laboratories, and topics for
// course titles.
type subject struct {
	name   string
	code   string
	lab    bool
	topics []string
}

var subjects = []subject{
	{"Applied Chemistry", "CHM", true, []string{"Analytical Chemistry", "Organic Synthesis", "Spectroscopy", "Reaction Kinetics", "Polymer Chemistry"}},
	{"Biosciences", "BIO", true, []string{"Cell Biology", "Genetics", "Microbiology", "Plant Physiology", "Ecology of Freshwater Systems"}},
	{"Physics", "PHY", true, []string{"Mechanics", "Electromagnetism", "Optics", "Thermodynamics", "Quantum Physics"}},
	{"Mathematics", "MTH", false, []string{"Calculus", "Linear Algebra", "Differential Equations", "Number Theory", "Real Analysis"}},
	{"Statistics and Data", "STA", false, []string{"Probability", "Statistical Inference", "Regression Modelling", "Sampling Methods", "Time Series"}},
	{"Computing", "CMP", false, []string{"Programming", "Data Structures", "Operating Systems", "Databases", "Computer Networks"}},
	{"Civil Engineering", "CIV", true, []string{"Structural Analysis", "Soil Mechanics", "Hydraulics", "Surveying", "Construction Materials"}},
	{"Mechanical Engineering", "MEC", true, []string{"Engineering Drawing", "Fluid Mechanics", "Machine Design", "Heat Transfer", "Dynamics of Machines"}},
	{"Electrical Engineering", "ELE", true, []string{"Circuit Theory", "Digital Electronics", "Power Systems", "Signals and Systems", "Control Engineering"}},
	{"Architecture", "ARQ", false, []string{"Design Studio", "Architectural History", "Building Technology", "Urban Form", "Environmental Design"}},
	{"Nursing", "NUR", true, []string{"Clinical Skills", "Anatomy and Physiology", "Community Care", "Pharmacology for Nurses", "Care of Older People"}},
	{"Pharmacy", "PHA", true, []string{"Pharmaceutics", "Medicinal Chemistry", "Pharmacology", "Dispensing Practice", "Clinical Therapeutics"}},
	{"Psychology", "PSY", false, []string{"Cognitive Psychology", "Developmental Psychology", "Social Psychology", "Research Methods", "Psychometrics"}},
	{"Economics", "ECN", false, []string{"Microeconomics", "Macroeconomics", "Econometrics", "Public Finance", "Labour Economics"}},
	{"Accounting and Finance", "ACF", false, []string{"Financial Accounting", "Management Accounting", "Corporate Finance", "Auditing", "Taxation"}},
	{"Business and Management", "BUS", false, []string{"Organisational Behaviour", "Marketing", "Operations Management", "Strategy", "Entrepreneurship"}},
	{"Law", "LAW", false, []string{"Contract Law", "Criminal Law", "Public Law", "Land Law", "Law of Torts"}},
	{"History", "HIS", false, []string{"Early Modern Europe", "Economic History", "Oral History", "History of Science", "Maritime History"}},
	{"Philosophy", "PHL", false, []string{"Ethics", "Logic", "Philosophy of Mind", "Epistemology", "Political Philosophy"}},
	{"Linguistics", "LNG", false, []string{"Phonetics", "Syntax", "Sociolinguistics", "Semantics", "Language Acquisition"}},
	{"Modern Languages", "MLA", false, []string{"French Language", "German Language", "Spanish Language", "Translation Studies", "Polish Language"}},
	{"Music", "MUS", false, []string{"Harmony and Counterpoint", "Performance", "Composition", "Music Technology", "Ethnomusicology"}},
	{"Fine Art", "FAR", false, []string{"Drawing", "Painting", "Sculpture", "Printmaking", "Contemporary Art Theory"}},
	{"Product Design", "PDS", true, []string{"Design Process", "Materials and Making", "Ergonomics", "Prototyping", "Design for Manufacture"}},
	{"Media and Film", "MFS", false, []string{"Film Analysis", "Screenwriting", "Documentary Practice", "Media Audiences", "Digital Cultures"}},
	{"Sociology", "SOC", false, []string{"Social Theory", "Inequality", "Sociology of Work", "Urban Sociology", "Qualitative Methods"}},
	{"Politics", "POL", false, []string{"Comparative Politics", "International Relations", "Public Policy", "Political Theory", "Elections and Parties"}},
	{"Geography", "GEG", true, []string{"Physical Geography", "Human Geography", "Geographic Information Systems", "Climatology", "Coastal Processes"}},
	{"Environmental Science", "ENV", true, []string{"Environmental Monitoring", "Soil Science", "Pollution Control", "Conservation Biology", "Environmental Risk"}},
	{"Earth Sciences", "ERS", true, []string{"Mineralogy", "Sedimentology", "Geophysics", "Palaeontology", "Structural Geology"}},
	{"Marine Studies", "MRN", true, []string{"Oceanography", "Marine Ecology", "Navigation", "Ship Stability", "Fisheries Science"}},
	{"Sport and Exercise Science", "SPX", true, []string{"Exercise Physiology", "Biomechanics", "Sport Psychology", "Coaching Practice", "Nutrition for Sport"}},
	{"Education", "EDU", false, []string{"Learning Theories", "Curriculum Design", "Inclusive Education", "Assessment", "Teaching Practice"}},
	{"Social Work", "SWK", false, []string{"Social Policy", "Child Protection", "Mental Health Practice", "Community Development", "Law for Social Workers"}},
	{"Hospitality and Tourism", "HTM", false, []string{"Tourism Geography", "Event Management", "Hospitality Operations", "Food and Beverage Management", "Heritage Tourism"}},
	{"Agriculture", "AGR", true, []string{"Crop Science", "Animal Husbandry", "Farm Management", "Soil Fertility", "Agricultural Engineering"}},
	{"Food Science", "FDS", true, []string{"Food Chemistry", "Food Microbiology", "Food Processing", "Sensory Analysis", "Food Safety"}},
	{"Journalism", "JRN", false, []string{"News Writing", "Media Law", "Data Journalism", "Broadcast Journalism", "Feature Writing"}},
	{"Anthropology", "ANT", false, []string{"Kinship", "Ethnography", "Material Culture", "Medical Anthropology", "Anthropology of Religion"}},
	{"Classics", "CLS", false, []string{"Latin", "Ancient Greek", "Greek Tragedy", "Roman History", "Classical Archaeology"}},
	{"Astronomy", "AST", true, []string{"Observational Astronomy", "Stellar Physics", "Galaxies", "Planetary Science", "Cosmology"}},
	{"Materials Science", "MAT", true, []string{"Crystallography", "Metallurgy", "Ceramics", "Composite Materials", "Materials Characterisation"}},
}

// titleForms turn a topic into a course title; %s is the topic. The later
// forms are long on purpose, to exercise line breaking in printed schedules.
var titleForms = []string{
	"%s",
	"Foundations of %s",
	"%s I",
	"%s II",
	"Advanced %s",
	"Topics in %s",
	"%s in Practice",
	"Introduction to %s",
	"%s: Theory, Methods and Professional Practice",
	"Contemporary Debates in %s and Their Applications",
}

// person name lists. A culture gives first names and family names in its own
// script, with an ASCII form for e-mail addresses when the script is not
// Latin; Latin-script names are folded to ASCII by asciiFold.
type givenName struct {
	name, ascii string
	female      bool
}

type familyName struct {
	male, female string // female == "" means the same as male
	ascii        string // ASCII form of the male name ("" means fold it)
	asciiFemale  string // ASCII form of the female name ("" means fold it)
}

type culture struct {
	weight int // relative share of staff drawn from this list
	given  []givenName
	family []familyName
}

func g(name string, female bool) givenName         { return givenName{name: name, female: female} }
func gx(name, ascii string, female bool) givenName { return givenName{name, ascii, female} }
func f(name string) familyName                     { return familyName{male: name} }
func fmf(m, fem string) familyName                 { return familyName{male: m, female: fem} }

var cultures = []culture{
	{weight: 6, given: []givenName{
		g("Alice", true), g("Ben", false), g("Claire", true), g("Daniel", false), g("Eleanor", true),
		g("Frank", false), g("Grace", true), g("Harry", false), g("Isla", true), g("James", false),
		g("Kate", true), g("Liam", false), g("Megan", true), g("Noah", false), g("Olivia", true),
		g("Peter", false), g("Rachel", true), g("Samuel", false), g("Tessa", true), g("William", false),
	}, family: []familyName{
		f("Ashdown"), f("Blackwood"), f("Carver"), f("Dunmore"), f("Ellery"), f("Fairweather"),
		f("Gresham"), f("Holloway"), f("Ingram"), f("Jessop"), f("Kettleby"), f("Marsh"),
		f("Northcott"), f("Oakes"), f("Pennington"), f("Quayle"), f("Rowntree"), f("Selby"),
		f("Thorne"), f("Underwood"), f("Vickers"), f("Whitlock"), f("Yardley"),
	}},
	{weight: 2, given: []givenName{
		g("Amélie", true), g("Benoît", false), g("Céline", true), g("Élodie", true), g("François", false),
		g("Hélène", true), g("Jérôme", false), g("Léa", true), g("Mathéo", false), g("Noémie", true),
	}, family: []familyName{
		f("Lefèvre"), f("Duchêne"), f("Gauthier"), f("Mercier"), f("Légaré"), f("Thibault"),
		f("Vasseur"), f("Fréchette"), f("Bérard"),
	}},
	{weight: 2, given: []givenName{
		g("Jürgen", false), g("Käthe", true), g("Lukas", false), g("Sören", false), g("Ute", true),
		g("Jörg", false), g("Anneliese", true), g("Björn", false), g("Mareike", true),
	}, family: []familyName{
		f("Strauß"), f("Weiß"), f("Groß"), f("Brückner"), f("Köhler"), f("Oßwald"),
		f("Schröder"), f("Fußmann"), f("Lößner"),
	}},
	{weight: 2, given: []givenName{
		g("Łukasz", false), g("Bartłomiej", false), g("Małgorzata", true), g("Paweł", false), g("Zofia", true),
		g("Michał", false), g("Agnieszka", true), g("Wojciech", false), g("Joanna", true),
	}, family: []familyName{
		fmf("Michałowski", "Michałowska"), f("Wróbel"), f("Kowalczyk"), fmf("Łęcki", "Łęcka"),
		fmf("Zieliński", "Zielińska"), f("Wójcik"), f("Główka"), fmf("Sadowski", "Sadowska"),
	}},
	{weight: 2, given: []givenName{
		gx("Σοφία", "Sofia", true), gx("Νικόλαος", "Nikolaos", false), gx("Ελένη", "Eleni", true),
		gx("Γιώργος", "Giorgos", false), gx("Δήμητρα", "Dimitra", true), gx("Κώστας", "Kostas", false),
		gx("Αθηνά", "Athina", true),
	}, family: []familyName{
		{male: "Αλεξίου", ascii: "Alexiou"}, {male: "Νικολάου", ascii: "Nikolaou"},
		{male: "Γεωργίου", ascii: "Georgiou"}, {male: "Οικονόμου", ascii: "Oikonomou"},
		{male: "Δημητρίου", ascii: "Dimitriou"}, {male: "Ιωάννου", ascii: "Ioannou"},
		{male: "Παύλου", ascii: "Pavlou"},
	}},
	{weight: 2, given: []givenName{
		gx("Олена", "Olena", true), gx("Андрій", "Andrii", false), gx("Ірина", "Iryna", true),
		gx("Дмитро", "Dmytro", false), gx("Тарас", "Taras", false), gx("Наталія", "Nataliia", true),
	}, family: []familyName{
		{male: "Коваленко", ascii: "Kovalenko"}, {male: "Шевчук", ascii: "Shevchuk"},
		{male: "Бондаренко", ascii: "Bondarenko"}, {male: "Мельник", ascii: "Melnyk"},
		{male: "Ткаченко", ascii: "Tkachenko"}, {male: "Кравчук", ascii: "Kravchuk"},
	}},
	{weight: 2, given: []givenName{
		g("José", false), g("María", true), g("Núria", true), g("Iñaki", false), g("Begoña", true),
		g("Sebastián", false), g("Lucía", true), g("Tomás", false),
	}, family: []familyName{
		f("Núñez"), f("Peña"), f("Ibáñez"), f("Muñoz"), f("Castaño"), f("Olmedo"), f("Echeverría"),
	}},
	{weight: 2, given: []givenName{
		g("Åsa", true), g("Søren", false), g("Øystein", false), g("Sigrún", true), g("Ingrid", true),
		g("Päivi", true), g("Mikael", false),
	}, family: []familyName{
		f("Sørensen"), f("Åberg"), f("Lindqvist"), f("Hjelmstad"), f("Ødegaard"), f("Virtanen"), f("Björklund"),
	}},
	{weight: 1, given: []givenName{
		g("Çağla", true), g("Şebnem", true), g("Emre", false), g("Gökhan", false), g("Ayşe", true),
		g("Barış", false), g("İlkay", true),
	}, family: []familyName{
		f("Çelik"), f("Şahin"), f("Yıldız"), f("Öztürk"), f("Aydın"), f("Güneş"),
	}},
	{weight: 1, given: []givenName{
		g("Siobhán", true), g("Seán", false), g("Aoife", true), g("Eoin", false), g("Niamh", true), g("Ciarán", false),
	}, family: []familyName{
		f("Breathnach"), fmf("Ó Ceallaigh", "Ní Cheallaigh"), fmf("Mac Cárthaigh", "Nic Cárthaigh"), f("Ó Dálaigh"),
	}},
	{weight: 1, given: []givenName{
		g("Adéọlá", true), g("Olúwaseun", false), g("Fúnmiláyọ̀", true), g("Bámidélé", false),
	}, family: []familyName{
		f("Adéyẹmí"), f("Ọládipọ̀"), f("Àjàyí"), f("Ògúnlẹ́yẹ"),
	}},
	{weight: 2, given: []givenName{
		g("Wei", false), g("Jing", true), g("Hao", false), g("Xin", true), g("Yu", true), g("Jun", false),
	}, family: []familyName{
		f("Chen"), f("Zhang"), f("Liu"), f("Huang"), f("Zhou"), f("Lin"),
	}},
	{weight: 2, given: []givenName{
		g("Aarav", false), g("Priya", true), g("Ananya", true), g("Rohan", false), g("Kavya", true), g("Vikram", false),
	}, family: []familyName{
		f("Iyer"), f("Menon"), f("Krishnan"), f("Desai"), f("Bhat"), f("Rao"),
	}},
	{weight: 2, given: []givenName{
		g("Layla", true), g("Omar", false), g("Yusuf", false), g("Amira", true), g("Karim", false), g("Nour", true),
	}, family: []familyName{
		f("Haddad"), f("Nasser"), f("Khalil"), f("Mansour"), f("Saleh"),
	}},
}

// foldTable maps the Latin letters with marks used above to ASCII.
var foldTable = map[rune]string{
	'á': "a", 'à': "a", 'â': "a", 'ä': "a", 'å': "a", 'ą': "a", 'Å': "A", 'Á': "A", 'À': "A",
	'ç': "c", 'ć': "c", 'Ç': "C",
	'é': "e", 'è': "e", 'ê': "e", 'ë': "e", 'ę': "e", 'É': "E", 'ẹ': "e",
	'í': "i", 'ì': "i", 'î': "i", 'ı': "i", 'İ': "I",
	'ł': "l", 'Ł': "L",
	'ñ': "n", 'ń': "n",
	'ó': "o", 'ò': "o", 'ô': "o", 'ö': "o", 'ø': "o", 'ọ': "o", 'Ó': "O", 'Ò': "O", 'Ö': "O", 'Ø': "O", 'Ọ': "O",
	'ś': "s", 'ş': "s", 'Ş': "S", 'ß': "ss",
	'ú': "u", 'ù': "u", 'û': "u", 'ü': "u",
	'ý': "y",
	'ź': "z", 'ż': "z",
	'ğ': "g",
}
