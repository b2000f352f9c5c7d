using System;
using Microsoft.EntityFrameworkCore.Migrations;
using Npgsql.EntityFrameworkCore.PostgreSQL.Metadata;

#nullable disable

namespace BarrierLedger.Ledger.Migrations.PostgreSQL
{
    /// <inheritdoc />
    public partial class InitialPostgreSQL : Migration
    {
        /// <inheritdoc />
        protected override void Up(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.CreateTable(
                name: "AspNetRoles",
                columns: table => new
                {
                    Id = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Name = table.Column<string>(type: "character varying(256)", maxLength: 256, nullable: true, collation: "C"),
                    NormalizedName = table.Column<string>(type: "character varying(256)", maxLength: 256, nullable: true, collation: "C"),
                    ConcurrencyStamp = table.Column<string>(type: "text", nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetRoles", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "AspNetUsers",
                columns: table => new
                {
                    Id = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    DisplayName = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    MustChangePassword = table.Column<bool>(type: "boolean", nullable: false),
                    CreatedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    UserName = table.Column<string>(type: "character varying(256)", maxLength: 256, nullable: true, collation: "C"),
                    NormalizedUserName = table.Column<string>(type: "character varying(256)", maxLength: 256, nullable: true, collation: "C"),
                    Email = table.Column<string>(type: "character varying(256)", maxLength: 256, nullable: true, collation: "C"),
                    NormalizedEmail = table.Column<string>(type: "character varying(256)", maxLength: 256, nullable: true, collation: "C"),
                    EmailConfirmed = table.Column<bool>(type: "boolean", nullable: false),
                    PasswordHash = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    SecurityStamp = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    ConcurrencyStamp = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    PhoneNumber = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    PhoneNumberConfirmed = table.Column<bool>(type: "boolean", nullable: false),
                    TwoFactorEnabled = table.Column<bool>(type: "boolean", nullable: false),
                    LockoutEnd = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    LockoutEnabled = table.Column<bool>(type: "boolean", nullable: false),
                    AccessFailedCount = table.Column<int>(type: "integer", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetUsers", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "AuditEvents",
                columns: table => new
                {
                    Id = table.Column<long>(type: "bigint", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    At = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    UserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Action = table.Column<string>(type: "character varying(60)", maxLength: 60, nullable: false, collation: "C"),
                    EntityType = table.Column<string>(type: "character varying(60)", maxLength: 60, nullable: false, collation: "C"),
                    EntityId = table.Column<string>(type: "character varying(60)", maxLength: 60, nullable: false, collation: "C"),
                    Summary = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Before = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    After = table.Column<string>(type: "text", nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AuditEvents", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "DataProtectionKeys",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    FriendlyName = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Xml = table.Column<string>(type: "text", nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_DataProtectionKeys", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "StoredFiles",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    Sha256 = table.Column<string>(type: "character varying(64)", maxLength: 64, nullable: false, collation: "C"),
                    FileName = table.Column<string>(type: "character varying(400)", maxLength: 400, nullable: false, collation: "C"),
                    SizeBytes = table.Column<long>(type: "bigint", nullable: false),
                    Content = table.Column<byte[]>(type: "bytea", nullable: false),
                    UploadedByUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    UploadedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_StoredFiles", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "Studies",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    Name = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    Description = table.Column<string>(type: "character varying(4000)", maxLength: 4000, nullable: false, collation: "C"),
                    OwnerUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    CreatedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    Retired = table.Column<bool>(type: "boolean", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Studies", x => x.Id);
                });

            migrationBuilder.CreateTable(
                name: "WorkLeases",
                columns: table => new
                {
                    Name = table.Column<string>(type: "character varying(64)", maxLength: 64, nullable: false, collation: "C"),
                    Holder = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: true, collation: "C"),
                    ExpiresAtUnixMs = table.Column<long>(type: "bigint", nullable: false),
                    RequestSerial = table.Column<long>(type: "bigint", nullable: false),
                    CompletedSerial = table.Column<long>(type: "bigint", nullable: false),
                    Phase = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    Done = table.Column<int>(type: "integer", nullable: false),
                    Total = table.Column<int>(type: "integer", nullable: false),
                    Secondary = table.Column<int>(type: "integer", nullable: false),
                    FinishedAtUnixMs = table.Column<long>(type: "bigint", nullable: true),
                    Error = table.Column<string>(type: "character varying(2000)", maxLength: 2000, nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_WorkLeases", x => x.Name);
                });

            migrationBuilder.CreateTable(
                name: "AspNetRoleClaims",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    RoleId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ClaimType = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    ClaimValue = table.Column<string>(type: "text", nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetRoleClaims", x => x.Id);
                    table.ForeignKey(
                        name: "FK_AspNetRoleClaims_AspNetRoles_RoleId",
                        column: x => x.RoleId,
                        principalTable: "AspNetRoles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "AspNetUserClaims",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    UserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ClaimType = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    ClaimValue = table.Column<string>(type: "text", nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetUserClaims", x => x.Id);
                    table.ForeignKey(
                        name: "FK_AspNetUserClaims_AspNetUsers_UserId",
                        column: x => x.UserId,
                        principalTable: "AspNetUsers",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "AspNetUserLogins",
                columns: table => new
                {
                    LoginProvider = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ProviderKey = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ProviderDisplayName = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    UserId = table.Column<string>(type: "text", nullable: false, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetUserLogins", x => new { x.LoginProvider, x.ProviderKey });
                    table.ForeignKey(
                        name: "FK_AspNetUserLogins_AspNetUsers_UserId",
                        column: x => x.UserId,
                        principalTable: "AspNetUsers",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "AspNetUserRoles",
                columns: table => new
                {
                    UserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    RoleId = table.Column<string>(type: "text", nullable: false, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetUserRoles", x => new { x.UserId, x.RoleId });
                    table.ForeignKey(
                        name: "FK_AspNetUserRoles_AspNetRoles_RoleId",
                        column: x => x.RoleId,
                        principalTable: "AspNetRoles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                    table.ForeignKey(
                        name: "FK_AspNetUserRoles_AspNetUsers_UserId",
                        column: x => x.UserId,
                        principalTable: "AspNetUsers",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "AspNetUserTokens",
                columns: table => new
                {
                    UserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    LoginProvider = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Name = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Value = table.Column<string>(type: "text", nullable: true, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_AspNetUserTokens", x => new { x.UserId, x.LoginProvider, x.Name });
                    table.ForeignKey(
                        name: "FK_AspNetUserTokens_AspNetUsers_UserId",
                        column: x => x.UserId,
                        principalTable: "AspNetUsers",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "EnergyModels",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    StudyId = table.Column<int>(type: "integer", nullable: true),
                    EnergyLevel = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ThermalLevel = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    TemperatureKelvin = table.Column<double>(type: "double precision", nullable: false),
                    StandardState = table.Column<string>(type: "character varying(30)", maxLength: 30, nullable: false),
                    Treatment = table.Column<string>(type: "character varying(40)", maxLength: 40, nullable: false),
                    QuasiRrhoCutoffCm1 = table.Column<double>(type: "double precision", nullable: false),
                    Tunnelling = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    DisplayUnit = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    SignificantImaginaryCm1 = table.Column<double>(type: "double precision", nullable: false),
                    ScanJumpKcalPerMol = table.Column<double>(type: "double precision", nullable: false),
                    UpdatedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    UpdatedByUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_EnergyModels", x => x.Id);
                    table.ForeignKey(
                        name: "FK_EnergyModels_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Reactions",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    StudyId = table.Column<int>(type: "integer", nullable: false),
                    Label = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    Description = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    OwnerUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    InputsRevision = table.Column<long>(type: "bigint", nullable: false),
                    Retired = table.Column<bool>(type: "boolean", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false),
                    SaddlePointCount = table.Column<int>(type: "integer", nullable: true),
                    CheckVerdict = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: true),
                    ReviewStatus = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Reactions", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Reactions_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Species",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    StudyId = table.Column<int>(type: "integer", nullable: false),
                    Label = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    Charge = table.Column<int>(type: "integer", nullable: false),
                    Multiplicity = table.Column<int>(type: "integer", nullable: false),
                    Formula = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    SymmetryNumber = table.Column<int>(type: "integer", nullable: false),
                    Retired = table.Column<bool>(type: "boolean", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Species", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Species_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Uploads",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    Key = table.Column<string>(type: "character varying(100)", maxLength: 100, nullable: false, collation: "C"),
                    StudyId = table.Column<int>(type: "integer", nullable: false),
                    UploaderUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    At = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    Summary = table.Column<string>(type: "text", nullable: false, collation: "C")
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Uploads", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Uploads_Studies_StudyId",
                        column: x => x.StudyId,
                        principalTable: "Studies",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "ReactionDerivations",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    ReactionId = table.Column<int>(type: "integer", nullable: false),
                    BarrierGibbsHartree = table.Column<double>(type: "double precision", nullable: true),
                    ReactionGibbsHartree = table.Column<double>(type: "double precision", nullable: true),
                    BarrierElectronicHartree = table.Column<double>(type: "double precision", nullable: true),
                    RateConstantPerSecond = table.Column<double>(type: "double precision", nullable: true),
                    HalfLifeSeconds = table.Column<double>(type: "double precision", nullable: true),
                    TemperatureKelvin = table.Column<double>(type: "double precision", nullable: false),
                    LevelOfTheory = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Consistent = table.Column<bool>(type: "boolean", nullable: false),
                    ConsistencyJson = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    StatesJson = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    StepsJson = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ModelFingerprint = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    InputFingerprint = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    InputsRevision = table.Column<long>(type: "bigint", nullable: false),
                    ComputedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionDerivations", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionDerivations_Reactions_ReactionId",
                        column: x => x.ReactionId,
                        principalTable: "Reactions",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "Calculations",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    SpeciesId = table.Column<int>(type: "integer", nullable: false),
                    UploadId = table.Column<int>(type: "integer", nullable: false),
                    Label = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    Kind = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    LevelOfTheory = table.Column<string>(type: "character varying(400)", maxLength: 400, nullable: false, collation: "C"),
                    Method = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Basis = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    Solvation = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    GeometryLevel = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    EnergyLevelKey = table.Column<string>(type: "character varying(400)", maxLength: 400, nullable: false, collation: "C"),
                    EnergyHartree = table.Column<double>(type: "double precision", nullable: true),
                    AtomCount = table.Column<int>(type: "integer", nullable: false),
                    AtomicNumbers = table.Column<byte[]>(type: "bytea", nullable: true),
                    PositionsAngstrom = table.Column<byte[]>(type: "bytea", nullable: true),
                    FrequenciesCm1 = table.Column<byte[]>(type: "bytea", nullable: true),
                    Modes = table.Column<byte[]>(type: "bytea", nullable: true),
                    HessianHartreePerBohr2 = table.Column<byte[]>(type: "bytea", nullable: true),
                    ThermalTemperatureKelvin = table.Column<double>(type: "double precision", nullable: true),
                    ZeroPointHartree = table.Column<double>(type: "double precision", nullable: true),
                    EnthalpyCorrectionHartree = table.Column<double>(type: "double precision", nullable: true),
                    GibbsCorrectionHartree = table.Column<double>(type: "double precision", nullable: true),
                    StoredFileId = table.Column<int>(type: "integer", nullable: true),
                    SourceSha256 = table.Column<string>(type: "character varying(64)", maxLength: 64, nullable: false, collation: "C"),
                    Note = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    UploadedByUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    UploadedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    Retired = table.Column<bool>(type: "boolean", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Calculations", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Calculations_Species_SpeciesId",
                        column: x => x.SpeciesId,
                        principalTable: "Species",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Calculations_StoredFiles_StoredFileId",
                        column: x => x.StoredFileId,
                        principalTable: "StoredFiles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Calculations_Uploads_UploadId",
                        column: x => x.UploadId,
                        principalTable: "Uploads",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "Scans",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    SpeciesId = table.Column<int>(type: "integer", nullable: false),
                    UploadId = table.Column<int>(type: "integer", nullable: false),
                    Label = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    LevelOfTheory = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    CoordinateKind = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    CoordinateAtoms = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    AtomicNumbers = table.Column<byte[]>(type: "bytea", nullable: true),
                    StoredFileId = table.Column<int>(type: "integer", nullable: true),
                    SourceSha256 = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    UploadedByUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    UploadedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false),
                    Retired = table.Column<bool>(type: "boolean", nullable: false),
                    RetiredAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: true),
                    RetiredByUserId = table.Column<string>(type: "text", nullable: true, collation: "C"),
                    Version = table.Column<long>(type: "bigint", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Scans", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Scans_Species_SpeciesId",
                        column: x => x.SpeciesId,
                        principalTable: "Species",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Scans_StoredFiles_StoredFileId",
                        column: x => x.StoredFileId,
                        principalTable: "StoredFiles",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_Scans_Uploads_UploadId",
                        column: x => x.UploadId,
                        principalTable: "Uploads",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "FrequencyChecks",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    CalculationId = table.Column<int>(type: "integer", nullable: false),
                    Verdict = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    ReasonsJson = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    EvidenceJson = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    InputFingerprint = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    ComputedAt = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_FrequencyChecks", x => x.Id);
                    table.ForeignKey(
                        name: "FK_FrequencyChecks_Calculations_CalculationId",
                        column: x => x.CalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "ReactionStates",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    ReactionId = table.Column<int>(type: "integer", nullable: false),
                    Position = table.Column<int>(type: "integer", nullable: false),
                    Label = table.Column<string>(type: "character varying(200)", maxLength: 200, nullable: false, collation: "C"),
                    Kind = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    SaddleCalculationId = table.Column<int>(type: "integer", nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionStates", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionStates_Calculations_SaddleCalculationId",
                        column: x => x.SaddleCalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                    table.ForeignKey(
                        name: "FK_ReactionStates_Reactions_ReactionId",
                        column: x => x.ReactionId,
                        principalTable: "Reactions",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "Reviews",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    CalculationId = table.Column<int>(type: "integer", nullable: false),
                    Outcome = table.Column<string>(type: "character varying(20)", maxLength: 20, nullable: false),
                    Comment = table.Column<string>(type: "character varying(4000)", maxLength: 4000, nullable: false, collation: "C"),
                    ReviewerUserId = table.Column<string>(type: "text", nullable: false, collation: "C"),
                    At = table.Column<DateTimeOffset>(type: "timestamp with time zone", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_Reviews", x => x.Id);
                    table.ForeignKey(
                        name: "FK_Reviews_Calculations_CalculationId",
                        column: x => x.CalculationId,
                        principalTable: "Calculations",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateTable(
                name: "ScanPoints",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    ScanId = table.Column<int>(type: "integer", nullable: false),
                    Index = table.Column<int>(type: "integer", nullable: false),
                    Coordinate = table.Column<double>(type: "double precision", nullable: false),
                    EnergyHartree = table.Column<double>(type: "double precision", nullable: false),
                    Converged = table.Column<bool>(type: "boolean", nullable: false),
                    PositionsAngstrom = table.Column<byte[]>(type: "bytea", nullable: true)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ScanPoints", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ScanPoints_Scans_ScanId",
                        column: x => x.ScanId,
                        principalTable: "Scans",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "ReactionCoordinatePairs",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    ReactionStateId = table.Column<int>(type: "integer", nullable: false),
                    AtomA = table.Column<int>(type: "integer", nullable: false),
                    AtomB = table.Column<int>(type: "integer", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionCoordinatePairs", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionCoordinatePairs_ReactionStates_ReactionStateId",
                        column: x => x.ReactionStateId,
                        principalTable: "ReactionStates",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                });

            migrationBuilder.CreateTable(
                name: "ReactionStateTerms",
                columns: table => new
                {
                    Id = table.Column<int>(type: "integer", nullable: false)
                        .Annotation("Npgsql:ValueGenerationStrategy", NpgsqlValueGenerationStrategy.IdentityByDefaultColumn),
                    ReactionStateId = table.Column<int>(type: "integer", nullable: false),
                    SpeciesId = table.Column<int>(type: "integer", nullable: false),
                    Coefficient = table.Column<int>(type: "integer", nullable: false)
                },
                constraints: table =>
                {
                    table.PrimaryKey("PK_ReactionStateTerms", x => x.Id);
                    table.ForeignKey(
                        name: "FK_ReactionStateTerms_ReactionStates_ReactionStateId",
                        column: x => x.ReactionStateId,
                        principalTable: "ReactionStates",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Cascade);
                    table.ForeignKey(
                        name: "FK_ReactionStateTerms_Species_SpeciesId",
                        column: x => x.SpeciesId,
                        principalTable: "Species",
                        principalColumn: "Id",
                        onDelete: ReferentialAction.Restrict);
                });

            migrationBuilder.CreateIndex(
                name: "IX_AspNetRoleClaims_RoleId",
                table: "AspNetRoleClaims",
                column: "RoleId");

            migrationBuilder.CreateIndex(
                name: "RoleNameIndex",
                table: "AspNetRoles",
                column: "NormalizedName",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_AspNetUserClaims_UserId",
                table: "AspNetUserClaims",
                column: "UserId");

            migrationBuilder.CreateIndex(
                name: "IX_AspNetUserLogins_UserId",
                table: "AspNetUserLogins",
                column: "UserId");

            migrationBuilder.CreateIndex(
                name: "IX_AspNetUserRoles_RoleId",
                table: "AspNetUserRoles",
                column: "RoleId");

            migrationBuilder.CreateIndex(
                name: "EmailIndex",
                table: "AspNetUsers",
                column: "NormalizedEmail");

            migrationBuilder.CreateIndex(
                name: "UserNameIndex",
                table: "AspNetUsers",
                column: "NormalizedUserName",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_AuditEvents_EntityType_EntityId",
                table: "AuditEvents",
                columns: new[] { "EntityType", "EntityId" });

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_SpeciesId_Kind",
                table: "Calculations",
                columns: new[] { "SpeciesId", "Kind" });

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_SpeciesId_SourceSha256_Label",
                table: "Calculations",
                columns: new[] { "SpeciesId", "SourceSha256", "Label" });

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_StoredFileId",
                table: "Calculations",
                column: "StoredFileId");

            migrationBuilder.CreateIndex(
                name: "IX_Calculations_UploadId",
                table: "Calculations",
                column: "UploadId");

            migrationBuilder.CreateIndex(
                name: "IX_EnergyModels_StudyId",
                table: "EnergyModels",
                column: "StudyId",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_FrequencyChecks_CalculationId",
                table: "FrequencyChecks",
                column: "CalculationId",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionCoordinatePairs_ReactionStateId",
                table: "ReactionCoordinatePairs",
                column: "ReactionStateId");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionDerivations_ReactionId",
                table: "ReactionDerivations",
                column: "ReactionId",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStateTerms_ReactionStateId",
                table: "ReactionStateTerms",
                column: "ReactionStateId");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStateTerms_SpeciesId",
                table: "ReactionStateTerms",
                column: "SpeciesId");

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStates_ReactionId_Position",
                table: "ReactionStates",
                columns: new[] { "ReactionId", "Position" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_ReactionStates_SaddleCalculationId",
                table: "ReactionStates",
                column: "SaddleCalculationId");

            migrationBuilder.CreateIndex(
                name: "IX_Reactions_StudyId_Label",
                table: "Reactions",
                columns: new[] { "StudyId", "Label" });

            migrationBuilder.CreateIndex(
                name: "IX_Reviews_CalculationId_Id",
                table: "Reviews",
                columns: new[] { "CalculationId", "Id" });

            migrationBuilder.CreateIndex(
                name: "IX_ScanPoints_ScanId_Index",
                table: "ScanPoints",
                columns: new[] { "ScanId", "Index" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Scans_SpeciesId",
                table: "Scans",
                column: "SpeciesId");

            migrationBuilder.CreateIndex(
                name: "IX_Scans_StoredFileId",
                table: "Scans",
                column: "StoredFileId");

            migrationBuilder.CreateIndex(
                name: "IX_Scans_UploadId",
                table: "Scans",
                column: "UploadId");

            migrationBuilder.CreateIndex(
                name: "IX_Species_StudyId_Label",
                table: "Species",
                columns: new[] { "StudyId", "Label" },
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_StoredFiles_Sha256",
                table: "StoredFiles",
                column: "Sha256",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Studies_Name",
                table: "Studies",
                column: "Name");

            migrationBuilder.CreateIndex(
                name: "IX_Uploads_Key",
                table: "Uploads",
                column: "Key",
                unique: true);

            migrationBuilder.CreateIndex(
                name: "IX_Uploads_StudyId",
                table: "Uploads",
                column: "StudyId");
        }

        /// <inheritdoc />
        protected override void Down(MigrationBuilder migrationBuilder)
        {
            migrationBuilder.DropTable(
                name: "AspNetRoleClaims");

            migrationBuilder.DropTable(
                name: "AspNetUserClaims");

            migrationBuilder.DropTable(
                name: "AspNetUserLogins");

            migrationBuilder.DropTable(
                name: "AspNetUserRoles");

            migrationBuilder.DropTable(
                name: "AspNetUserTokens");

            migrationBuilder.DropTable(
                name: "AuditEvents");

            migrationBuilder.DropTable(
                name: "DataProtectionKeys");

            migrationBuilder.DropTable(
                name: "EnergyModels");

            migrationBuilder.DropTable(
                name: "FrequencyChecks");

            migrationBuilder.DropTable(
                name: "ReactionCoordinatePairs");

            migrationBuilder.DropTable(
                name: "ReactionDerivations");

            migrationBuilder.DropTable(
                name: "ReactionStateTerms");

            migrationBuilder.DropTable(
                name: "Reviews");

            migrationBuilder.DropTable(
                name: "ScanPoints");

            migrationBuilder.DropTable(
                name: "WorkLeases");

            migrationBuilder.DropTable(
                name: "AspNetRoles");

            migrationBuilder.DropTable(
                name: "AspNetUsers");

            migrationBuilder.DropTable(
                name: "ReactionStates");

            migrationBuilder.DropTable(
                name: "Scans");

            migrationBuilder.DropTable(
                name: "Calculations");

            migrationBuilder.DropTable(
                name: "Reactions");

            migrationBuilder.DropTable(
                name: "Species");

            migrationBuilder.DropTable(
                name: "StoredFiles");

            migrationBuilder.DropTable(
                name: "Uploads");

            migrationBuilder.DropTable(
                name: "Studies");
        }
    }
}
