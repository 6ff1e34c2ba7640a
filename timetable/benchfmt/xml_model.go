package benchfmt

// The ITC-2019 instance format (Müller, Rudová, Müllerová, "University
// course timetabling and International Timetabling Competition 2019",
// PATAT 2018, and the competition's published format description): a
// problem with a number of days, 5-minute slots per day and weeks; the
// weights of the time, room, distribution and student parts; rooms with
// capacity, travel times (in slots) to other rooms and unavailable times;
// courses made of configurations of subparts of classes, each class with
// its acceptable rooms and times (each with a penalty); distributions
// (required or with a penalty) over classes; and students with the courses
// they want. Days and weeks are bit strings, the first character being the
// first day (Monday) or the first week.

// XMLInstance is one ITC-2019 instance as read, kept whole (Term maps it,
// course structure and students included).
type XMLInstance struct {
	Name          string
	Days          int // days per week (bit string length), 1..7
	SlotsPerDay   int // 5-minute slots per day
	Weeks         int // weeks of the term (bit string length), 1..64
	Weights       XMLWeights
	Rooms         []XMLRoom
	Courses       []XMLCourse
	Classes       []XMLClass // every class in file order
	Distributions []XMLDistribution
	Students      []XMLStudent
}

// XMLWeights are the weights of the four cost parts.
type XMLWeights struct {
	Time, Room, Distribution, Student int
}

// XMLRoom is a room with its capacity, travel times and unavailable times.
type XMLRoom struct {
	ID          string
	Capacity    int
	Travel      []XMLTravel
	Unavailable []XMLTime // Penalty unused
	Line        int
}

// XMLTravel is the travel time, in slots, from the room holding it to Room.
type XMLTravel struct {
	Room  string
	Slots int
}

// XMLTime is a time of a class (or an unavailable time of a room): the days
// of Days, from slot Start for Length slots, in the weeks of Weeks. Bit i of
// Days is the i-th character of the days string (Monday first), bit i of
// Weeks the i-th week.
type XMLTime struct {
	Days    uint8
	Start   int
	Length  int
	Weeks   uint64
	Penalty int
}

// End is the slot the time ends (exclusive).
func (t XMLTime) End() int { return t.Start + t.Length }

// XMLCourse is the structure of one course: configurations of subparts of
// class IDs. A student of the course takes one configuration and one class
// of each of its subparts (respecting parents); used for sectioning.
type XMLCourse struct {
	ID      string
	Configs []XMLConfig
}

// XMLConfig is one configuration of a course.
type XMLConfig struct {
	ID       string
	Subparts []XMLSubpart
}

// XMLSubpart is one subpart of a configuration, with its class IDs.
type XMLSubpart struct {
	ID      string
	Classes []string
}

// XMLClass is one class: what it belongs to, its limit, and its acceptable
// rooms and times.
type XMLClass struct {
	ID      string
	Course  string
	Config  string
	Subpart string
	Parent  string // "" when none
	Limit   int
	NoRoom  bool // the class takes no room
	Rooms   []XMLRoomChoice
	Times   []XMLTime
	Line    int
}

// XMLRoomChoice is an acceptable room of a class with its penalty.
type XMLRoomChoice struct {
	Room    string
	Penalty int
}

// XMLDistribution is one distribution constraint over classes (in order).
type XMLDistribution struct {
	Type     string // base name, e.g. "MaxBlock"
	Params   []int  // the numbers in parentheses, e.g. M and S of MaxBlock(M,S)
	Required bool
	Penalty  int // when not Required
	Classes  []string
	Line     int
}

// XMLStudent is one student with the courses they want.
type XMLStudent struct {
	ID      string
	Courses []string
	Line    int
}

// xmlKinds gives the number of parameters of every distribution type.
var xmlKinds = map[string]int{
	"SameStart": 0, "SameTime": 0, "DifferentTime": 0, "SameDays": 0, "DifferentDays": 0,
	"SameWeeks": 0, "DifferentWeeks": 0, "Overlap": 0, "NotOverlap": 0, "SameRoom": 0,
	"DifferentRoom": 0, "SameAttendees": 0, "Precedence": 0,
	"WorkDay": 1, "MinGap": 1, "MaxDays": 1, "MaxDayLoad": 1, "MaxBreaks": 2, "MaxBlock": 2,
}

// classIndex maps class IDs to positions in Classes.
func (in *XMLInstance) classIndex() map[string]int {
	m := make(map[string]int, len(in.Classes))
	for i, c := range in.Classes {
		m[c.ID] = i
	}
	return m
}

// travelTable gives the travel time in slots between two rooms, both ways:
// the largest given in either direction (absent = 0).
func (in *XMLInstance) travelTable() map[[2]string]int {
	m := map[[2]string]int{}
	for _, r := range in.Rooms {
		for _, t := range r.Travel {
			for _, k := range [][2]string{{r.ID, t.Room}, {t.Room, r.ID}} {
				if t.Slots > m[k] {
					m[k] = t.Slots
				}
			}
		}
	}
	return m
}
